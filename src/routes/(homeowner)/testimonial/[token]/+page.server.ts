import { error, fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { testimonialSchema } from '$lib/schema/jobs';
import { submitTestimonial, testimonialForHomeowner } from '$lib/server/jobs/testimonials';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const t = await testimonialForHomeowner(params.token);
	if (!t) error(404, 'This link is not valid.');
	return { t };
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		const data = await request.formData();
		const parsed = testimonialSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		const outcome = await submitTestimonial(params.token, parsed.data);
		if (outcome === 'missing') error(404, 'This link is not valid.');
		if (outcome === 'expired') {
			return fail(410, { values: formValues(data), errors: { _form: 'This link has expired.' } });
		}
		return { saved: true };
	}
};
