// The production server: adapter-node's handler behind a plain node:http server that puts the
// security headers on every response. adapter-node serves prerendered pages and assets before the
// app's hooks run, so without this they would go out without them (the hook sets the same
// headers on rendered responses, and a page's own value, such as a token page's no-referrer,
// still wins because SvelteKit writes its headers after these).
// `node scripts/serve.js [build folder]` (default BUILD_DIR, then `build`); PORT and HOST as for
// `node build`.
import { createServer } from 'node:http';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

export const SECURITY_HEADERS = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	'x-frame-options': 'DENY',
	// Prerendered pages carry their CSP in a <meta> tag, which cannot say frame-ancestors.
	'content-security-policy': "frame-ancestors 'none'"
};

const dir = resolve(process.argv[2] ?? process.env.BUILD_DIR ?? 'build');
const { handler } = await import(pathToFileURL(resolve(dir, 'handler.js')).href);

const server = createServer((req, res) => {
	for (const [name, value] of Object.entries(SECURITY_HEADERS)) res.setHeader(name, value);
	handler(req, res, () => {
		res.statusCode = 404;
		res.end('Not found');
	});
});

const host = process.env.HOST ?? '0.0.0.0';
const port = Number(process.env.PORT ?? 3000);
server.listen(port, host, () => console.log(`Listening on http://${host}:${port}`));

function shutdown() {
	server.close(() => process.exit(0));
	server.closeIdleConnections();
	setTimeout(() => process.exit(0), 5_000).unref();
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
