// A purchase order's PDF as a download: the same document the supplier is mailed, for the office
// to print or send another way.
import { requireRole } from '$lib/server/auth/access';
import { orHttp } from '$lib/server/http/domain';
import { orderPdf } from '$lib/server/purchasing/orders';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const { filename, pdf } = await orHttp(() =>
		orderPdf(user, event.params.id, event.params.orderId)
	);
	return new Response(pdf as BodyInit, {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `attachment; filename="${filename}"`,
			'cache-control': 'private, no-store'
		}
	});
};
