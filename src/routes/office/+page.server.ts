import { requireRole } from '$lib/server/access';
import type { SessionUser } from '$lib/server/auth';
import { listJobs } from '$lib/server/jobsite';
import { todaySummary } from '$lib/server/leads';
import { firmSettings } from '$lib/server/settings';
import { listMembers, pendingInvitations } from '$lib/server/team';
import type { PageServerLoad } from './$types';

const CREW_DAYS_AHEAD = 14;

/** A crew lead's install days from today on, two weeks ahead, in the firm's calendar. */
async function crewInstallDays(user: SessionUser, timeZone: string) {
	const today = new Intl.DateTimeFormat('en-CA', { timeZone }).format(new Date());
	const last = new Date(`${today}T00:00:00Z`);
	last.setUTCDate(last.getUTCDate() + CREW_DAYS_AHEAD - 1);
	const until = last.toISOString().slice(0, 10);
	const jobs = await listJobs(user);
	const days = jobs
		.filter((job) => job.stage !== 'complete' && job.stage !== 'paid')
		.flatMap((job) =>
			job.days
				.filter((day) => day >= today && day <= until)
				.map((day) => ({
					day,
					job: {
						id: job.id,
						number: job.number,
						title: job.title,
						street: job.street,
						town: job.town,
						stage: job.stage
					}
				}))
		)
		.sort((a, b) => a.day.localeCompare(b.day) || a.job.number - b.job.number);
	return { today, days, daysAhead: CREW_DAYS_AHEAD };
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
