import type { Handle } from '@sveltejs/kit';
import { blankSessionCookie, sessionCookieName, validateSessionToken } from '../auth/sessions';
import { isDatabaseUnavailable, outagePage } from '../platform/outage';

/** Looks the session up once per request and puts the user in locals. */
export const handleSession: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	const token = event.cookies.get(sessionCookieName);
	if (token) {
		try {
			const found = await validateSessionToken(token);
			if (found) {
				event.locals.user = found.user;
				event.locals.session = found.session;
			} else {
				const blank = blankSessionCookie();
				event.cookies.set(blank.name, blank.value, { ...blank.attributes, path: '/' });
			}
		} catch (error) {
			if (isDatabaseUnavailable(error)) return outagePage();
			throw error;
		}
	}
	return resolve(event);
};
