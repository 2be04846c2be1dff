import { requireRole } from '$lib/server/auth/access';
import { assignableStaff } from '$lib/server/leads/leads';
import { firmSettings } from '$lib/server/platform/settings';
import type { PageServerLoad } from './$types';

// The rows themselves are fetched by the page from /api/leads, driven by the URL.
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const [staff, firm] = await Promise.all([assignableStaff(), firmSettings()]);
	return { staff, replyTargetHours: firm.replyTargetHours, userId: user.id };
};
