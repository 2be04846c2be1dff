// The one route-to-role table: the first line of defence, enforced in hooks.server.ts.
// Every action and endpoint checks the role again with requireRole where it reads or writes.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '../platform/db/schema';
import type { SessionUser } from './sessions';

export const ALL_STAFF: readonly Role[] = ['owner', 'sales', 'crew'];

/** Longest matching prefix wins. Paths not listed under /office or /api are refused. */
export const ROUTE_ROLES: ReadonlyArray<{ prefix: string; roles: readonly Role[] }> = [
	{ prefix: '/office/team', roles: ['owner'] },
	{ prefix: '/office/settings', roles: ['owner'] },
	{ prefix: '/office/account', roles: ALL_STAFF },
	{ prefix: '/office/estimates', roles: ['owner', 'sales'] },
	{ prefix: '/office/price-list', roles: ['owner', 'sales'] },
	{ prefix: '/office/leads', roles: ['owner', 'sales'] },
	{ prefix: '/office/payments', roles: ['owner'] },
	{ prefix: '/office/visits', roles: ['owner', 'sales'] },
	{ prefix: '/office/availability', roles: ['owner', 'sales'] },
	{ prefix: '/api/visits', roles: ['owner', 'sales'] },
	{ prefix: '/office/care/plans', roles: ['owner'] },
	{ prefix: '/office/care/season', roles: ['owner'] },
	// Crew open the service visits of their days; each visit checks that it is theirs.
	{ prefix: '/office/care/visits', roles: ALL_STAFF },
	{ prefix: '/office/care', roles: ['owner', 'sales'] },
	{ prefix: '/office/jobs/settings', roles: ['owner'] },
	// Job costing: margins, costs and learned labor rates are the owner's.
	{ prefix: '/office/costing', roles: ['owner'] },
	// Warranty callbacks: crew open the ones assigned to them (each callback checks it).
	{ prefix: '/office/callbacks', roles: ALL_STAFF },
	{ prefix: '/office/jobs/new', roles: ['owner', 'sales'] },
	// Crew may open jobs; each job checks that it is theirs (jobFor in $lib/server/jobs).
	{ prefix: '/office/jobs', roles: ALL_STAFF },
	{ prefix: '/office', roles: ALL_STAFF },
	{ prefix: '/api/health', roles: [] },
	{ prefix: '/api/estimates', roles: ['owner', 'sales'] },
	{ prefix: '/api/leads', roles: ['owner', 'sales'] },
	// Prospects are anonymous: the inquiry's photo uploads are public (rate-limited in the route).
	{ prefix: '/api/uploads', roles: [] },
	// The payment provider calls it; the SDK's signature check is the guard.
	{ prefix: '/api/payments/webhook', roles: [] },
	{ prefix: '/api', roles: ALL_STAFF }
];

export function isGuarded(pathname: string): boolean {
	return /^\/(office|api)(\/|$)/.test(pathname);
}

/** The roles allowed on a guarded path; an empty list means the path is public. */
export function rolesFor(pathname: string): readonly Role[] | null {
	let best: { prefix: string; roles: readonly Role[] } | null = null;
	for (const rule of ROUTE_ROLES) {
		const matches = pathname === rule.prefix || pathname.startsWith(rule.prefix + '/');
		if (matches && (!best || rule.prefix.length > best.prefix.length)) best = rule;
	}
	return best?.roles ?? null;
}

/** Re-checks the role inside an action or endpoint; returns the signed-in user. */
export function requireRole(
	event: Pick<RequestEvent, 'locals' | 'url'>,
	...roles: Role[]
): SessionUser {
	const user = event.locals.user;
	if (!user) {
		if (event.url.pathname.startsWith('/api')) error(401, 'Sign in first');
		redirect(303, `/sign-in?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	if (!roles.includes(user.role)) error(403, 'Your role does not allow this');
	return user;
}
