import { requireRole } from '$lib/server/access';
import { listEstimates } from '$lib/server/estimates';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const status = event.url.searchParams.get('status');
	const rows = await listEstimates();
	return { rows: status ? rows.filter((r) => r.status === status) : rows, status };
};
