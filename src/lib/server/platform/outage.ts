// Recognises "the database cannot be reached" among errors, so pages answer 503, not 500.
const CONNECTION_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'ETIMEDOUT',
	'CONNECT_TIMEOUT',
	'CONNECTION_CLOSED',
	'CONNECTION_ENDED',
	'CONNECTION_DESTROYED',
	'57P01', // admin_shutdown
	'57P02', // crash_shutdown
	'57P03' // cannot_connect_now
]);

export function isDatabaseUnavailable(error: unknown): boolean {
	let current: unknown = error;
	for (let depth = 0; current && depth < 5; depth++) {
		const code = (current as { code?: unknown }).code;
		if (typeof code === 'string' && CONNECTION_CODES.has(code)) return true;
		current = (current as { cause?: unknown }).cause;
	}
	return false;
}

export function outagePage(): Response {
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>Back in a moment</title>
<style>body{font-family:Georgia,serif;background:#fbf8f2;color:#1d2421;display:grid;place-items:center;min-height:90vh;margin:0;padding:1rem}main{max-width:32rem}h1{font-size:1.8rem}a{color:#1b5356}</style></head>
<body><main><h1>Back in a moment</h1><p>Our records are out of reach for a short while, so this page cannot be shown right now. Nothing you saved is lost.</p><p>Please try again in a minute. <a href="">Reload this page</a></p></main></body></html>`;
	return new Response(html, {
		status: 503,
		headers: {
			'content-type': 'text/html; charset=utf-8',
			'retry-after': '30',
			'cache-control': 'no-store'
		}
	});
}
