import { error, json } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schema/auth';
import { slotsQuerySchema } from '$lib/schema/visits';
import { requireRole } from '$lib/server/auth/access';
import { slotsFor } from '$lib/server/visits/slots';
import type { RequestHandler } from './$types';
import { inZone } from '$lib/firm-time';

/** Free start times of one salesperson between two local dates (inclusive), in the firm's zone. */
export const GET: RequestHandler = async (event) => {
	requireRole(event, 'owner', 'sales');
	const parsed = slotsQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success) {
		return json({ message: 'Check the query', errors: fieldErrors(parsed.error) }, { status: 400 });
	}
	const q = parsed.data;
	const result = await slotsFor(q.salespersonId, q.from, q.to, {
		excludeVisitId: q.excludeVisitId
	});
	if (!result) error(404, 'No such salesperson');
	const shown = q.timeZone ?? result.timeZone;
	return json({
		timeZone: result.timeZone,
		visitMinutes: result.rules.visitMinutes,
		slots: result.slots.map((s) => ({
			start: s.start.toISOString(),
			end: s.end.toISOString(),
			date: s.date,
			label: inZone(s.start, shown, 'time')
		}))
	});
};
