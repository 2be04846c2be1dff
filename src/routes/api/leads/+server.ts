import { json } from '@sveltejs/kit';
import { parseLeadQuery } from '$lib/schema/leads';
import { requireRole } from '$lib/server/auth/access';
import { listLeads } from '$lib/server/leads/leads';
import type { RequestHandler } from './$types';

/** The office leads table: one page of rows, the total and the count per stage. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const parsed = parseLeadQuery(event.url.searchParams);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({
			param: i.path.join('.') || null,
			message: i.message
		}));
		return json(
			{
				error: issues.map((i) => (i.param ? `${i.param}: ${i.message}` : i.message)).join('; '),
				issues
			},
			{ status: 400 }
		);
	}
	const list = await listLeads(parsed.data, { userId: user.id });
	return json(list, { headers: { 'cache-control': 'no-store' } });
};
