import type { Handle } from '@sveltejs/kit';

/** Security headers every response carries; the CSP comes from svelte.config.js. */
export const handleHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	// A page may ask for a stricter policy (the homeowner's link pages send none at all).
	if (!response.headers.has('referrer-policy')) {
		response.headers.set('referrer-policy', 'strict-origin-when-cross-origin');
	}
	response.headers.set('x-frame-options', 'DENY');
	if (event.url.pathname.startsWith('/office') || event.url.pathname.startsWith('/api')) {
		response.headers.set('cache-control', 'private, no-store');
	}
	return response;
};
