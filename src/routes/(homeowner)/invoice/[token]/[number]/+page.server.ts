import { error } from '@sveltejs/kit';
import { jobForToken } from '$lib/server/payments/checkout';
import { firmTimeZone } from '$lib/server/platform/settings';
import { invoiceByNumber } from '$lib/server/payments/invoices';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const job = await jobForToken(params.token);
	const invoice = job ? await invoiceByNumber(Number(params.number)) : null;
	if (!job || !invoice || invoice.jobId !== job.id) error(404, 'There is no such invoice.');
	return { invoice, token: params.token, timeZone: await firmTimeZone() };
};
