import { requireRole } from '$lib/server/access';
import { listMembers, pendingInvitations } from '$lib/server/team';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	if (user.role !== 'owner') return { team: null };
	const [members, invitations] = await Promise.all([listMembers(), pendingInvitations()]);
	return {
		team: {
			active: members.filter((m) => !m.disabledAt).length,
			disabled: members.filter((m) => m.disabledAt).length,
			invitations: invitations.length
		}
	};
};
