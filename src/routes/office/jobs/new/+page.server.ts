import { error, fail, redirect } from '@sveltejs/kit';
import { formValues } from '$lib/schema/auth';
import { saleByHandSchema } from '$lib/schema/jobs';
import { requireRole } from '$lib/server/auth/access';
import { JobError } from '$lib/server/jobs/errors';
import { leadForSale, recordSaleByHand, sellableEstimates } from '$lib/server/jobs/conversion';
import { firmToday } from '$lib/server/platform/settings';
import { parseForm } from '$lib/server/platform/forms';
import type { Actions, PageServerLoad } from './$types';

// "Mark sold by hand": a yes on signed paper or by phone, recorded by staff; the same conversion.
export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const leadId = event.url.searchParams.get('lead') ?? '';
	const lead = leadId ? await leadForSale(leadId) : null;
	if (!lead) error(404, 'Open this from a lead: no lead was named.');
	return { lead, estimates: await sellableEstimates(lead.id), today: await firmToday() };
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, saleByHandSchema);
		if (!parsed.ok) return parsed.failure;
		const data = parsed.form;
		let jobId: string;
		try {
			({ jobId } = await recordSaleByHand(
				parsed.data.estimateId,
				{
					typedName: parsed.data.typedName,
					method: parsed.data.method,
					acceptedOn: new Date(`${parsed.data.acceptedOn}T12:00:00Z`)
				},
				user
			));
		} catch (e) {
			if (e instanceof JobError) {
				return fail(400, { values: formValues(data), errors: { _form: e.message } });
			}
			throw e;
		}
		redirect(303, `/office/jobs/${jobId}`);
	}
};
