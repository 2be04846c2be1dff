import type { Handle } from '@sveltejs/kit';
import { isGuarded, rolesFor } from '../auth/access';
import { requestPath } from '../http/request-path';
import { refusal } from './refusal';

const HINT =
	"If you think you should be able to open this page, ask the firm's owner about your role.";

/**
 * Enforces the route-to-role table for /office/** and /api/**, on the path as the router sees it
 * (decoded as the router decodes, and normalised), so `/office/%74eam` or `//office/./team` meet
 * the same rule as `/office/team`, and an encoded `/` never moves a segment boundary.
 */
export const handleGuard: Handle = async ({ event, resolve }) => {
	const raw = event.url.pathname;
	const pathname = requestPath(raw);
	// A path the guard cannot read the router's way is not let through on a guess.
	if (pathname === null) return refusal(raw, 400, 'The address cannot be read');
	if (!isGuarded(pathname)) return resolve(event);
	const roles = rolesFor(pathname);
	if (roles && roles.length === 0) return resolve(event);
	const user = event.locals.user;
	if (!user) {
		if (pathname.startsWith('/api')) return refusal(pathname, 401, 'Sign in first');
		const next = encodeURIComponent(pathname + event.url.search);
		return new Response(null, { status: 303, headers: { location: `/sign-in?next=${next}` } });
	}
	if (!roles || !roles.includes(user.role)) {
		return refusal(pathname, 403, 'Your role does not allow this page', HINT);
	}
	return resolve(event);
};
