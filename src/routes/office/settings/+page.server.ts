import { fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { requireRole } from '$lib/server/auth/access';
import { firmSettings, saveSettings, settingsSchema } from '$lib/server/platform/settings';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	return { settings: await firmSettings() };
};

export const actions: Actions = {
	default: async (event) => {
		requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = settingsSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		await saveSettings(parsed.data);
		return { saved: true };
	}
};
