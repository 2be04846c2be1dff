import { error, redirect, type Handle } from '@sveltejs/kit';
import { isGuarded, rolesFor } from '../access';

/** Enforces the route-to-role table for /office/** and /api/**. */
export const handleGuard: Handle = async ({ event, resolve }) => {
	const { pathname } = event.url;
	if (!isGuarded(pathname)) return resolve(event);
	const roles = rolesFor(pathname);
	if (roles && roles.length === 0) return resolve(event);
	const user = event.locals.user;
	if (!user) {
		if (pathname.startsWith('/api')) error(401, 'Sign in first');
		redirect(303, `/sign-in?next=${encodeURIComponent(pathname + event.url.search)}`);
	}
	if (!roles || !roles.includes(user.role)) error(403, 'Your role does not allow this page');
	return resolve(event);
};
