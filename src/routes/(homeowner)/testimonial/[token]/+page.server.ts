import { error, fail } from '@sveltejs/kit';
import { formValues } from '$lib/schema/auth';
import { testimonialSchema } from '$lib/schema/jobs';
import { submitTestimonial, testimonialForHomeowner } from '$lib/server/jobs/testimonials';
import { parseForm } from '$lib/server/platform/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const t = await testimonialForHomeowner(params.token);
	if (!t) error(404, 'This link is not valid.');
	return { t };
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		const parsed = await parseForm(request, testimonialSchema);
		if (!parsed.ok) return parsed.failure;
		const data = parsed.form;
		const outcome = await submitTestimonial(params.token, parsed.data);
		if (outcome === 'missing') error(404, 'This link is not valid.');
		if (outcome === 'expired') {
			return fail(410, { values: formValues(data), errors: { _form: 'This link has expired.' } });
		}
		return { saved: true };
	}
};
