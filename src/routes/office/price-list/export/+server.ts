import { requireRole } from '$lib/server/access';
import { exportCsv } from '$lib/server/pricelist';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	requireRole(event, 'owner', 'sales');
	return new Response(await exportCsv(), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="price-list.csv"',
			'cache-control': 'private, no-store'
		}
	});
};
