import { addDays, todayIn } from '$lib/scheduling/zone';
import { dateSchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import { installDays, listJobs } from '$lib/server/jobs/read';
import { firmSettings } from '$lib/server/platform/settings';
import { lateMaterials } from '$lib/server/purchasing/orders';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales', 'crew');
	const firm = await firmSettings();
	const today = todayIn(firm.timeZone);
	// Not a real date (2027-13-01, 2027-02-30, junk): start from today rather than fail.
	const asked = dateSchema.safeParse(event.url.searchParams.get('from'));
	const from = asked.success ? asked.data : today;
	// The calendar starts on the Monday of the week asked for, and shows three weeks.
	const weekday = (new Date(`${from}T00:00:00Z`).getUTCDay() + 6) % 7;
	const start = addDays(from, -weekday);
	const end = addDays(start, 20);
	const [jobs, days] = await Promise.all([listJobs(user), installDays(user, start, end)]);
	// Jobs whose ordered materials will not be on site before the first install day.
	const late = await lateMaterials([...new Set(days.map((d) => d.jobId))]);
	return {
		jobs,
		calendar: {
			start,
			end,
			days,
			late: Object.fromEntries(late),
			prev: addDays(start, -21),
			next: addDays(start, 21)
		},
		today,
		todays: jobs.filter((j) => j.days.includes(today)),
		canSell: user.role !== 'crew',
		isOwner: user.role === 'owner'
	};
};
