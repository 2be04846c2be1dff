import { error, fail, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { saleByHandSchema } from '$lib/schema/jobs';
import { requireRole } from '$lib/server/auth/access';
import { db } from '$lib/server/platform/db';
import { contacts, leads } from '$lib/server/platform/db/schema';
import { JobError } from '$lib/server/jobs/errors';
import { recordSaleByHand, sellableEstimates } from '$lib/server/jobs/conversion';
import { firmToday } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';

// "Mark sold by hand": a yes on signed paper or by phone, recorded by staff; the same conversion.
export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const leadId = event.url.searchParams.get('lead') ?? '';
	const [lead] = leadId
		? await db
				.select({ id: leads.id, number: leads.number, name: contacts.name })
				.from(leads)
				.innerJoin(contacts, eq(contacts.id, leads.contactId))
				.where(eq(leads.id, leadId))
		: [];
	if (!lead) error(404, 'Open this from a lead: no lead was named.');
	return { lead, estimates: await sellableEstimates(lead.id), today: await firmToday() };
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = saleByHandSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
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
