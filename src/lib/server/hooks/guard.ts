import type { Handle } from '@sveltejs/kit';
import { isGuarded, rolesFor } from '../access';
import { escapeHtml } from '../mail';

// The guard answers with plain responses (not thrown errors), so the outer handles still add
// their security headers to refusals.
function refuse(pathname: string, status: 401 | 403, message: string): Response {
	if (pathname.startsWith('/api')) return Response.json({ message }, { status });
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${status} · ${escapeHtml(message)}</title>
<style>body{font-family:Georgia,serif;background:#fbf8f2;color:#1d2421;margin:0;padding:4rem 1rem}main{max-width:34rem;margin:auto}p.code{color:#7d3c17;font-weight:600;font-family:system-ui,sans-serif}h1{font-size:2rem;margin:.3rem 0 1rem}a{color:#1b5356}</style></head>
<body><main><p class="code">Error ${status}</p><h1>${escapeHtml(message)}</h1><p>If you think you should be able to open this page, ask the firm's owner about your role.</p><p><a href="/office">Back to the office</a> · <a href="/">The public site</a></p></main></body></html>`;
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

/** Enforces the route-to-role table for /office/** and /api/**. */
export const handleGuard: Handle = async ({ event, resolve }) => {
	const { pathname } = event.url;
	if (!isGuarded(pathname)) return resolve(event);
	const roles = rolesFor(pathname);
	if (roles && roles.length === 0) return resolve(event);
	const user = event.locals.user;
	if (!user) {
		if (pathname.startsWith('/api')) return refuse(pathname, 401, 'Sign in first');
		const next = encodeURIComponent(pathname + event.url.search);
		return new Response(null, { status: 303, headers: { location: `/sign-in?next=${next}` } });
	}
	if (!roles || !roles.includes(user.role)) {
		return refuse(pathname, 403, 'Your role does not allow this page');
	}
	return resolve(event);
};
