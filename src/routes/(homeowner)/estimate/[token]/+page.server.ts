import { error, fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schema/auth';
import { acceptSchema, declineSchema, questionSchema } from '$lib/schema/estimates';
import { HOMEOWNER_CAUTIONS } from '$lib/components/estimates/labels';
import { planSizes } from '$lib/components/estimates/plan';
import { acceptEstimate, homeownerMessage, openByToken } from '$lib/server/estimates/homeowner';
import { leadWithContact } from '$lib/server/estimates/records';
import { readDesign } from '$lib/estimating';
import { yardPhotos } from '$lib/server/photos/estimate-photos';
import { estimatingConfig } from '$lib/server/pricelist/catalog';
import { firmSettings } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';

// The homeowner's private page: no sign-in, the token is the key. Wrong, expired and superseded
// links all answer the same 404 (as the visit and change-order links do), so nothing hints that
// other estimates exist or that this one ever did.
export const load: PageServerLoad = async ({ params }) => {
	const firm = await firmSettings();
	const brand = {
		name: firm.firmName,
		phone: firm.phone,
		email: firm.email,
		timeZone: firm.timeZone
	};
	const view = await openByToken(params.token);
	if (view.kind === 'unavailable') {
		error(404, {
			message: `It may have expired, been replaced by a newer link, or been copied incompletely. Call us at ${firm.phone} or write to ${firm.email} and we will send you a fresh one.`,
			code: 'estimate-link'
		});
	}
	const found = await leadWithContact(view.estimate.leadId);
	const reference = `R-${found?.lead.number ?? ''} v${view.estimate.number}`;
	if (view.kind === 'accepted') {
		const a = view.acceptance;
		return {
			brand,
			view: {
				kind: 'accepted' as const,
				reference,
				typedName: a.typedName,
				acceptedAt: a.acceptedAt.toISOString(),
				totalCents: a.totalCents,
				depositCents: a.depositCents
			}
		};
	}
	if (view.kind === 'declined') return { brand, view: { kind: 'declined' as const, reference } };
	const { engine, priced } = view.stored;
	const [config, photos] = await Promise.all([
		estimatingConfig(),
		yardPhotos(view.estimate.leadId)
	]);
	const design = readDesign(view.estimate.design);
	return {
		brand,
		view: {
			kind: 'open' as const,
			reference,
			homeowner: found?.contact.name ?? '',
			scope: view.estimate.scope,
			designName: String(view.estimate.design.name ?? ''),
			design: design.success ? design.data : null,
			planSizes: planSizes(engine.features ?? []),
			photos,
			expiresAt: view.estimate.expiresAt!.toISOString(),
			lines: priced.lines.map((l) => ({
				key: l.key,
				bucket: l.bucket,
				feature: l.feature,
				name: l.name,
				quantity: l.quantity,
				unit: l.unit,
				extendedCents: l.extendedCents
			})),
			pricing: priced.pricing,
			depositPercent: priced.depositPercent,
			cautions: engine.cautions.filter((c) => HOMEOWNER_CAUTIONS.has(c.id)),
			terms: config.terms
		}
	};
};

function choicesFrom(data: FormData) {
	const alternates: Record<string, string> = {};
	for (const [key, value] of data) {
		if (key.startsWith('alt.') && typeof value === 'string') alternates[key.slice(4)] = value;
	}
	return { options: data.getAll('options').map(String), alternates };
}

export const actions: Actions = {
	accept: async (event) => {
		const data = await event.request.formData();
		const parsed = acceptSchema.safeParse({
			fullName: data.get('fullName') ?? '',
			agree: data.get('agree') ?? undefined,
			...choicesFrom(data)
		});
		if (!parsed.success) {
			return fail(400, {
				action: 'accept',
				values: { fullName: String(data.get('fullName') ?? '') },
				errors: fieldErrors(parsed.error)
			});
		}
		const out = await acceptEstimate(event.params.token, parsed.data, {
			ip: safeAddress(event),
			userAgent: event.request.headers.get('user-agent')
		});
		if (out.kind === 'unavailable') {
			return fail(410, { action: 'accept', message: 'This estimate can no longer be accepted.' });
		}
		return { accepted: true };
	},
	decline: async (event) => {
		const data = await event.request.formData();
		const parsed = declineSchema.safeParse({ reason: data.get('reason') ?? '' });
		if (!parsed.success) return fail(400, { action: 'decline', errors: fieldErrors(parsed.error) });
		const ok = await homeownerMessage(event.params.token, 'decline', parsed.data.reason);
		if (!ok) return fail(410, { action: 'decline', message: 'This estimate is no longer open.' });
		return { declined: true };
	},
	question: async (event) => {
		const data = await event.request.formData();
		const parsed = questionSchema.safeParse({ question: data.get('question') ?? '' });
		if (!parsed.success) {
			return fail(400, { action: 'question', errors: fieldErrors(parsed.error) });
		}
		const ok = await homeownerMessage(event.params.token, 'question', parsed.data.question);
		if (!ok) return fail(410, { action: 'question', message: 'This estimate is no longer open.' });
		return { asked: true };
	}
};

function safeAddress(event: { getClientAddress: () => string }) {
	try {
		return event.getClientAddress();
	} catch {
		return null;
	}
}
