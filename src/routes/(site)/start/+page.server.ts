import { fail, redirect } from '@sveltejs/kit';
import { projectBySlug } from '$lib/content';
import { inquiryValues } from '$lib/schema/intake';
import { formStamp, thanksPath } from '$lib/server/leads/intake/stamp';
import { inquiryLimiter } from '$lib/server/leads/intake/limits';
import { receiveInquiry } from '$lib/server/leads/intake/form';
import type { Actions, PageServerLoad } from './$types';

export const prerender = false;

function projectCard(slug: string) {
	const p = projectBySlug(slug);
	return p ? { slug: p.slug, title: p.title, town: p.town, cover: p.cover } : null;
}

export const load: PageServerLoad = ({ url }) => {
	const ref = url.searchParams.get('ref') ?? '';
	return { project: ref ? projectCard(ref) : null, startedAt: formStamp() };
};

export const actions: Actions = {
	default: async (event) => {
		const data = await event.request.formData();
		if (await inquiryLimiter.isLimited(event)) {
			return fail(429, {
				message:
					'Several inquiries came from your address just now. Please wait a few minutes, or call us.',
				errors: {},
				values: inquiryValues(data),
				drafts: [],
				startedAt: formStamp()
			});
		}
		const result = await receiveInquiry(data, {
			projectTitle: (slug) => projectBySlug(slug)?.title
		});
		if (result.ok) redirect(303, thanksPath(result.number));
		const { status, ...rest } = result;
		return fail(status, { ...rest, startedAt: formStamp() });
	}
};
