import type { Handle, HandleServerError } from '@sveltejs/kit';
import { isDatabaseUnavailable, outagePage } from '../platform/outage';

const OUTAGE = Symbol('database unavailable');
type Flagged = { [OUTAGE]?: boolean };

/** Turns a page that failed because the database is unreachable into a friendly 503. */
export const handleOutage: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status >= 500 && (event.locals as Flagged)[OUTAGE]) {
		if (event.url.pathname.startsWith('/api')) {
			return Response.json(
				{ message: 'The database is out of reach; try again shortly' },
				{ status: 503, headers: { 'retry-after': '30' } }
			);
		}
		return outagePage();
	}
	return response;
};

export const handleServerError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseUnavailable(error)) {
		(event.locals as Flagged)[OUTAGE] = true;
		return {
			message: 'Our records are out of reach for a moment. Please try again shortly.',
			code: 'DB_UNAVAILABLE'
		};
	}
	if (status >= 500) console.error(`[${event.request.method} ${event.url.pathname}]`, error);
	return {
		message: status >= 500 ? 'Something went wrong on our side. It has been logged.' : message
	};
};
