import { json } from '@sveltejs/kit';
import { client } from '$lib/server/platform/db';
import type { RequestHandler } from './$types';

/** For a load balancer or a person: is this process able to reach its database? (public) */
export const GET: RequestHandler = async () => {
	try {
		await client`select 1`;
		return json({ ok: true, database: 'up' });
	} catch {
		return json({ ok: false, database: 'unreachable' }, { status: 503 });
	}
};
