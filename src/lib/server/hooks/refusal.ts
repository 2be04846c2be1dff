import { escapeHtml } from '../platform/mail';

/**
 * A plain refusal from a hook: JSON for the API, a small page otherwise. Hooks answer with
 * responses rather than thrown errors so the outer handles still add their security headers.
 */
export function refusal(pathname: string, status: number, message: string, hint = ''): Response {
	if (pathname.startsWith('/api')) return Response.json({ message }, { status });
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${status} · ${escapeHtml(message)}</title>
<style>body{font-family:Georgia,serif;background:#fbf8f2;color:#1d2421;margin:0;padding:4rem 1rem}main{max-width:34rem;margin:auto}p.code{color:#7d3c17;font-weight:600;font-family:system-ui,sans-serif}h1{font-size:2rem;margin:.3rem 0 1rem}a{color:#1b5356}</style></head>
<body><main><p class="code">Error ${status}</p><h1>${escapeHtml(message)}</h1>${hint ? `<p>${escapeHtml(hint)}</p>` : ''}<p><a href="/office">Back to the office</a> · <a href="/">The public site</a></p></main></body></html>`;
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}
