import { json } from '@sveltejs/kit';
import { databaseReachable } from '$lib/server/platform/db';
import type { RequestHandler } from './$types';

/** For a load balancer or a person: is this process able to reach its database? (public) */
export const GET: RequestHandler = async () => {
	if (await databaseReachable()) return json({ ok: true, database: 'up' });
	return json({ ok: false, database: 'unreachable' }, { status: 503 });
};
