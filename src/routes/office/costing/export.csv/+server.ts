import { requireRole } from '$lib/server/auth/access';
import { completedJobs } from '$lib/server/costing/report';
import { firmSettings } from '$lib/server/platform/settings';
import { calendarDate, todayIn } from '$lib/scheduling/zone';
import { marginsCsv } from '$lib/costing/csv';
import type { RequestHandler } from './$types';

/** Every completed job with its margin (a small firm's list: built whole, not streamed). */
export const GET: RequestHandler = async (event) => {
	requireRole(event, 'owner');
	const { timeZone } = await firmSettings();
	const rows = await completedJobs();
	const body = marginsCsv(
		rows.map((r) => ({ ...r, completedOn: calendarDate(r.completedAt, timeZone) }))
	);
	return new Response(body, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="job-margins-${todayIn(timeZone)}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
