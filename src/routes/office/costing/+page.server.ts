import { costingSettingsSchema } from '$lib/schema/costing';
import { requireRole } from '$lib/server/auth/access';
import { completedJobs, costingConfig, saveCostingConfig } from '$lib/server/costing/report';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

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
		const parsed = await parseForm(event.request, costingSettingsSchema);
		if (!parsed.ok) return parsed.failure;
		await saveCostingConfig(parsed.data);
		return { saved: true };
	}
};
