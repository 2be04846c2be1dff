import { requireRole } from '$lib/server/auth/access';
import { firmSettings, saveSettings, settingsSchema } from '$lib/server/platform/settings';
import { parseForm } from '$lib/server/platform/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	return { settings: await firmSettings() };
};

export const actions: Actions = {
	default: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, settingsSchema);
		if (!parsed.ok) return parsed.failure;
		await saveSettings(parsed.data);
		return { saved: true };
	}
};
