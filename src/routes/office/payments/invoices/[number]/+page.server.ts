import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import { firmTimeZone } from '$lib/server/platform/settings';
import { invoiceByNumber } from '$lib/server/payments/invoices';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const invoice = await invoiceByNumber(Number(event.params.number));
	if (!invoice) error(404, 'There is no such invoice.');
	return { invoice, timeZone: await firmTimeZone() };
};
