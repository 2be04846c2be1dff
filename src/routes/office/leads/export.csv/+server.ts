import { error } from '@sveltejs/kit';
import { parseLeadQuery } from '$lib/schema/leads';
import { requireRole } from '$lib/server/auth/access';
import { leadsCsvStream } from '$lib/server/leads/export';
import { firmSettings } from '$lib/server/platform/settings';
import { todayIn } from '$lib/scheduling/zone';
import type { RequestHandler } from './$types';

/**
 * The current filtered view (every page of it), as CSV, times in the firm's time zone, streamed
 * from the database in batches (see $lib/server/leads/export.ts).
 */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const parsed = parseLeadQuery(event.url.searchParams);
	if (!parsed.success) {
		error(400, parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	}
	const { timeZone } = await firmSettings();
	// SvelteKit answers HEAD with GET and drops the body unread: starting the query then would
	// hold a database connection for a reader that never comes.
	const stream =
		event.request.method === 'HEAD'
			? null
			: await leadsCsvStream(parsed.data, { userId: user.id }, timeZone);
	const day = todayIn(timeZone);
	return new Response(stream, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="leads-${day}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
