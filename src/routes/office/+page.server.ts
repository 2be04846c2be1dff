import { requireRole } from '$lib/server/access';
import { todaySummary } from '$lib/server/leads';
import { firmSettings } from '$lib/server/settings';
import { listMembers, pendingInvitations } from '$lib/server/team';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const seesLeads = user.role === 'owner' || user.role === 'sales';
	const [leads, firm, team] = await Promise.all([
		seesLeads ? todaySummary() : null,
		firmSettings(),
		user.role === 'owner'
			? Promise.all([listMembers(), pendingInvitations()]).then(([members, invitations]) => ({
					active: members.filter((m) => !m.disabledAt).length,
					disabled: members.filter((m) => m.disabledAt).length,
					invitations: invitations.length
				}))
			: null
	]);
	return { leads, team, replyTargetHours: firm.replyTargetHours };
};
