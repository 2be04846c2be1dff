import { error, redirect } from '@sveltejs/kit';
import { planSchema } from '$lib/schema/care';
import { FEATURE_KINDS, FEATURE_SIZES, VISIT_KINDS } from '$lib/care/kinds';
import { requireRole } from '$lib/server/auth/access';
import { domainAction } from '$lib/server/http/domain';
import { planById, savePlan } from '$lib/server/care/plans';
import { CareError } from '$lib/server/care/db';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	if (event.params.id === 'new') return { plan: null };
	try {
		return { plan: await planById(event.params.id) };
	} catch (e) {
		if (e instanceof CareError) error(404, e.message);
		throw e;
	}
};

/** The form's flat fields in the schema's shape (visits included by checkbox, one item a line). */
function fromForm(data: FormData) {
	const text = (name: string) => String(data.get(name) ?? '');
	return {
		name: text('name'),
		summary: text('summary'),
		terms: text('terms'),
		payYearly: data.get('payYearly') === 'on',
		payPerVisit: data.get('payPerVisit') === 'on',
		active: data.get('active') === 'on',
		visits: VISIT_KINDS.filter((k) => data.get(`visit.${k}`) === 'on').map((kind) => ({
			kind,
			minutes: text(`minutes.${kind}`),
			checklist: text(`checklist.${kind}`)
				.split('\n')
				.map((l) => l.trim())
				.filter(Boolean)
		})),
		prices: Object.fromEntries(
			FEATURE_KINDS.map((k) => [
				k,
				Object.fromEntries(FEATURE_SIZES.map((s) => [s, text(`price.${k}.${s}`)]))
			])
		)
	};
}

export const actions: Actions = {
	default: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, planSchema, { read: fromForm });
		if (!parsed.ok) return parsed.failure;
		const id = await domainAction(() =>
			savePlan(event.params.id === 'new' ? null : event.params.id, parsed.data)
		);
		if (typeof id !== 'string') return id;
		redirect(303, `/office/care/plans/${id}?saved=1`);
	}
};
