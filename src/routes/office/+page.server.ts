import { requireRole } from '$lib/server/auth/access';
import type { SessionUser } from '$lib/server/auth/sessions';
import { installDays } from '$lib/server/jobs/read';
import { crewServiceDays } from '$lib/server/care/service';
import { crewCallbackDays } from '$lib/server/callbacks/callbacks';
import { addDays } from '$lib/scheduling/zone';
import { todaySummary } from '$lib/server/leads/leads';
import { firmSettings } from '$lib/server/platform/settings';
import { listMembers, pendingInvitations } from '$lib/server/auth/team';
import type { PageServerLoad } from './$types';

const CREW_DAYS_AHEAD = 14;

/** A crew lead's install days, service visits and warranty callbacks from today on, two weeks ahead, in the firm's calendar. */
async function crewInstallDays(user: SessionUser, timeZone: string) {
	const today = new Intl.DateTimeFormat('en-CA', { timeZone }).format(new Date());
	const rows = await installDays(user, today, addDays(today, CREW_DAYS_AHEAD - 1));
	const days = rows
		.filter((row) => row.stage !== 'complete' && row.stage !== 'paid')
		.map(({ day, ...job }) => ({ day, job: { ...job, id: job.jobId } }));
	const last = addDays(today, CREW_DAYS_AHEAD - 1);
	const [service, callbacks] = await Promise.all([
		crewServiceDays(user, today, last),
		crewCallbackDays(user, today, last)
	]);
	return { today, days, service, callbacks, daysAhead: CREW_DAYS_AHEAD };
}

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const seesLeads = user.role === 'owner' || user.role === 'sales';
	const firm = await firmSettings();
	const [leads, crew, team] = await Promise.all([
		seesLeads ? todaySummary() : null,
		user.role === 'crew' ? crewInstallDays(user, firm.timeZone) : null,
		user.role === 'owner'
			? Promise.all([listMembers(), pendingInvitations()]).then(([members, invitations]) => ({
					active: members.filter((m) => !m.disabledAt).length,
					disabled: members.filter((m) => m.disabledAt).length,
					invitations: invitations.length
				}))
			: null
	]);
	return { leads, crew, team, replyTargetHours: firm.replyTargetHours };
};
