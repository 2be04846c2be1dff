import { error } from '@sveltejs/kit';
import { csvLine } from '$lib/csv';
import {
	BUDGET_LABELS,
	SERVICE_LABELS,
	STAGE_LABELS,
	label,
	parseLeadQuery
} from '$lib/schema/leads';
import { requireRole } from '$lib/server/access';
import { allLeadRows } from '$lib/server/leads';
import { firmSettings } from '$lib/server/settings';
import { formatWhen } from '$lib/components/leads/format';
import { todayIn } from '$lib/scheduling/zone';
import type { RequestHandler } from './$types';

const HEADER = [
	'Number',
	'Received',
	'Name',
	'E-mail',
	'Phone',
	'Town',
	'Services',
	'Budget',
	'Stage',
	'Close reason',
	'Assignee',
	'Priority',
	'Source',
	'First reply',
	'Last touch'
];

/** The current filtered view (every page of it), as CSV, times in the firm's time zone. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const parsed = parseLeadQuery(event.url.searchParams);
	if (!parsed.success) {
		error(400, parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	}
	const { timeZone } = await firmSettings();
	const rows = allLeadRows(parsed.data, { userId: user.id });
	// The first batch is read before the answer starts, so a query that fails answers with an
	// error status instead of a 200 that stops after the header row.
	let pending: Awaited<ReturnType<typeof rows.next>> | null = await rows.next();
	const encoder = new TextEncoder();
	const stream = new ReadableStream<Uint8Array>({
		async start(controller) {
			controller.enqueue(encoder.encode(csvLine(HEADER)));
		},
		async pull(controller) {
			const next = pending ?? (await rows.next());
			pending = null;
			if (next.done) return controller.close();
			controller.enqueue(
				encoder.encode(
					next.value
						.map((r) =>
							csvLine([
								`R-${r.number}`,
								formatWhen(r.createdAt, timeZone),
								r.name,
								r.email,
								r.phone,
								r.town,
								r.services.map((s) => label(SERVICE_LABELS, s)).join('; '),
								label(BUDGET_LABELS, r.budget),
								STAGE_LABELS[r.stage],
								r.closeReason,
								r.assigneeName,
								r.priority,
								r.source,
								r.firstReplyAt ? formatWhen(r.firstReplyAt, timeZone) : '',
								formatWhen(r.lastTouchAt, timeZone)
							])
						)
						.join('')
				)
			);
		},
		async cancel() {
			await rows.return(undefined);
		}
	});
	const day = todayIn(timeZone);
	return new Response(stream, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="leads-${day}.csv"`,
			'cache-control': 'no-store'
		}
	});
};
