import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { fieldErrors } from '$lib/schema/auth';
import { careSettingsSchema } from '$lib/schema/jobs';
import { requireRole } from '$lib/server/auth/access';
import { careSettings, saveCareSettings } from '$lib/server/care/reminders';
import { setTestimonialApproved, submittedTestimonials } from '$lib/server/jobs/testimonials';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const [care, words] = await Promise.all([careSettings(), submittedTestimonials()]);
	return { care, words };
};

export const actions: Actions = {
	care: async (event) => {
		requireRole(event, 'owner');
		const parsed = careSettingsSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		await saveCareSettings(parsed.data);
		return { saved: true };
	},
	approve: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = z
			.object({ id: z.string().min(1), on: z.enum(['1', '0']) })
			.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { errors: { _form: 'Pick a testimonial' } });
		await setTestimonialApproved(owner, parsed.data.id, parsed.data.on === '1');
		return { approved: true };
	}
};
