import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import { exportPriceList } from '$lib/server/pricelist/catalog';
import { PRICE_LISTS } from '$lib/server/pricelist/csv';
import type { RequestHandler } from './$types';

const FILE_NAMES = {
	items: 'price-list.csv',
	pumps: 'price-list-pumps.csv',
	labor: 'price-list-labor.csv'
} as const;

/** `?list=items` (the default), `pumps` or `labor`. */
export const GET: RequestHandler = async (event) => {
	requireRole(event, 'owner', 'sales');
	const wanted = event.url.searchParams.get('list') ?? 'items';
	const list = PRICE_LISTS.find((l) => l === wanted);
	if (!list) error(400, 'Export list must be items, pumps or labor');
	return new Response(await exportPriceList(list), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${FILE_NAMES[list]}"`,
			'cache-control': 'private, no-store'
		}
	});
};
