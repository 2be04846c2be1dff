import { navFor } from '$lib/office/nav';
import { requireRole } from '$lib/server/access';
import { firmSettings } from '$lib/server/settings';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const firm = await firmSettings();
	return { user, nav: navFor(user.role), firm: { name: firm.firmName, timeZone: firm.timeZone } };
};
