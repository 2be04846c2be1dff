import { error, fail, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/access';
import {
	acceptanceFor,
	estimatesForLead,
	getEstimate,
	leadWithContact
} from '$lib/server/estimates/records';
import { createEstimate, newVersion } from '$lib/server/estimates/versions';
import { sendEstimate } from '$lib/server/estimates/sending';
import { estimatingConfig, loadCatalog } from '$lib/server/pricelist/catalog';
import { estimateActionSchema } from '$lib/schema/estimates';
import { firmSettings } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { parseForm } from '$lib/server/platform/forms';

/** The estimate a button names, only when it is one of this lead's versions. */
async function estimateOfThisLead(event: RequestEvent): Promise<string | null> {
	const parsed = await parseForm(event.request, estimateActionSchema);
	if (!parsed.ok) return null;
	const estimate = await getEstimate(parsed.data.estimateId);
	return estimate && estimate.leadId === event.params.id ? estimate.id : null;
}

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const found = await leadWithContact(event.params.id);
	if (!found) error(404, 'No such lead');
	const versions = await estimatesForLead(event.params.id);
	const wanted = Number(event.url.searchParams.get('v'));
	const current = versions.find((v) => v.number === wanted) ?? versions[0] ?? null;
	const [catalog, config, firm] = await Promise.all([
		loadCatalog(),
		estimatingConfig(),
		firmSettings()
	]);
	return {
		lead: { id: found.lead.id, number: found.lead.number, stage: found.lead.stage },
		contact: { name: found.contact.name, email: found.contact.email },
		versions: versions.map((v) => ({ id: v.id, number: v.number, status: v.status })),
		estimate: current,
		acceptance: current ? await acceptanceFor(current.id) : null,
		// A draft computes against today's price list; a sent one against its frozen copy.
		catalog: current && current.status !== 'draft' && current.catalog ? current.catalog : catalog,
		terms: config.terms,
		firm: { name: firm.firmName, phone: firm.phone, email: firm.email, timeZone: firm.timeZone }
	};
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const id = await createEstimate(event.params.id, user);
		if (!id) error(404, 'No such lead');
		redirect(303, `/office/leads/${event.params.id}/estimate`);
	},
	newVersion: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const estimateId = await estimateOfThisLead(event);
		if (!estimateId) {
			return fail(404, { message: 'That is not a version of this lead’s estimate.' });
		}
		const id = await newVersion(estimateId, user);
		if (!id) return fail(404, { message: 'No such estimate' });
		redirect(303, `/office/leads/${event.params.id}/estimate`);
	},
	send: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const estimateId = await estimateOfThisLead(event);
		if (!estimateId) {
			return fail(404, { message: 'That is not a version of this lead’s estimate.' });
		}
		const out = await sendEstimate(estimateId, user);
		if (out.kind === 'missing') return fail(404, { message: 'No such estimate' });
		if (out.kind === 'invalid') return fail(400, { message: out.message });
		return { sent: true, expiresAt: out.expiresAt.toISOString() };
	}
};
