import { navFor } from '$lib/office/nav';
import { requireRole } from '$lib/server/auth/access';
import { firmSettings } from '$lib/server/platform/settings';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const firm = await firmSettings();
	return { user, nav: navFor(user.role), firm: { name: firm.firmName, timeZone: firm.timeZone } };
};
