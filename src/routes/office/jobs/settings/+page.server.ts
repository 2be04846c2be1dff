import { z } from 'zod';
import { careSettingsSchema } from '$lib/schema/jobs';
import { requireRole } from '$lib/server/auth/access';
import { careSettings, saveCareSettings } from '$lib/server/care/reminders';
import { setTestimonialApproved, submittedTestimonials } from '$lib/server/jobs/testimonials';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const [care, words] = await Promise.all([careSettings(), submittedTestimonials()]);
	return { care, words };
};

const approveSchema = z.object({
	id: z.string().min(1, 'Pick a testimonial'),
	on: z.enum(['1', '0'])
});

export const actions: Actions = {
	care: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, careSettingsSchema);
		if (!parsed.ok) return parsed.failure;
		await saveCareSettings(parsed.data);
		return { saved: true };
	},
	approve: async (event) => {
		const owner = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, approveSchema);
		if (!parsed.ok) return parsed.failure;
		await setTestimonialApproved(owner, parsed.data.id, parsed.data.on === '1');
		return { approved: true };
	}
};
