import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { domainAction } from '$lib/server/http/domain';
import { serviceVisitPhotoLinks } from '$lib/server/care/photos';
import {
	homeownerVisit,
	requestAnotherDay,
	startVisitCheckout,
	visitForLink
} from '$lib/server/care/service';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';
import { toCheckout } from '../../checkout';

const NOT_FOUND = 'This link does not open a visit. Ask us for a new one.';

async function visitOf(token: string) {
	const v = await visitForLink(token);
	if (!v) error(404, NOT_FOUND);
	return v;
}

export const load: PageServerLoad = async ({ params, url }) => {
	const v = await visitOf(params.token);
	return {
		view: await homeownerVisit(v),
		photos: v.status === 'done' ? await serviceVisitPhotoLinks(v.id) : [],
		cancelled: url.searchParams.get('cancelled') === '1'
	};
};

export const actions: Actions = {
	another: async ({ params, request }) => {
		const v = await visitOf(params.token);
		const parsed = await parseForm(
			request,
			z.object({
				message: z
					.string()
					.trim()
					.min(3, 'Tell us which days suit you')
					.max(1000, 'At most 1000 characters')
			}),
			{
				extra: { form: 'another' },
				message: true
			}
		);
		if (!parsed.ok) return parsed.failure;
		const r = await domainAction(() => requestAnotherDay(v, parsed.data.message), 'another');
		return r ?? { form: 'another', sent: true };
	},
	pay: async ({ params }) => {
		const v = await visitOf(params.token);
		return toCheckout(() => startVisitCheckout(v, params.token), 'visit checkout');
	}
};
