import { requireRole } from '$lib/server/auth/access';
import { feedMadeAt, resetFeed } from '$lib/server/care/calendar';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	return { madeAt: await feedMadeAt(user.id) };
};

export const actions: Actions = {
	reset: async (event) => {
		const user = requireRole(event, 'owner', 'sales', 'crew');
		return { url: await resetFeed(user.id) };
	}
};
