import { fail } from '@sveltejs/kit';
import { fieldErrors, formValues } from '$lib/schema/auth';
import { costingSettingsSchema } from '$lib/schema/costing';
import { requireRole } from '$lib/server/auth/access';
import { completedJobs, costingConfig, saveCostingConfig } from '$lib/server/costing/report';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner');
	const [jobs, config] = await Promise.all([completedJobs(), costingConfig()]);
	return {
		jobs: jobs.map((j) => ({ ...j, completedAt: j.completedAt.toISOString() })),
		config
	};
};

export const actions: Actions = {
	settings: async (event) => {
		requireRole(event, 'owner');
		const data = await event.request.formData();
		const parsed = costingSettingsSchema.safeParse(Object.fromEntries(data));
		if (!parsed.success) {
			return fail(400, { values: formValues(data), errors: fieldErrors(parsed.error) });
		}
		await saveCostingConfig(parsed.data);
		return { saved: true };
	}
};
