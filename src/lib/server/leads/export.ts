// The leads CSV export as a stream: rows come from a postgres.js cursor in batches and go to the
// response as they come, so memory stays flat whatever the number of rows.
//
// - One batch is always on its way while the previous one is written (the cursor's next batch is
//   asked for before the current one is formatted), and no more: the stream's `pull` runs only
//   when the response has taken the last chunk, so a slow client holds the query back
//   (back-pressure) instead of filling the app's memory.
// - A client that goes away cancels the stream; the cursor is then closed, which ends the query
//   and gives its connection back to the pool.
// - An error after the first byte errors the stream: the server then breaks the connection before
//   the end of the chunked body, so the client sees a failed download, never a short valid file.
import { csvLine } from '$lib/csv';
import type { LeadQuery } from '$lib/schema/leads';
import { client } from '../platform/db';
import { EXPORT_COLUMNS, exportSql } from './export-sql';
import { exportWriter, type ExportRow } from './export-lines';
import type { ListContext } from './list-sql';

/**
 * Rows per cursor batch: about 100 KB of CSV, one round trip per batch. Larger batches outlive
 * the server's small young generation (see production.ts) and cost more in collections.
 */
export const EXPORT_BATCH_ROWS = 500;

type Batch = ExportRow[];
type Param = Parameters<typeof client.unsafe>[1];

/**
 * Starts the export of a filtered view and waits for its first batch, so that a query that
 * cannot start (database down, bad time zone) fails as an ordinary error response, before any
 * byte of the file was sent. The stream begins with the header row, even for an empty view.
 */
export async function leadsCsvStream(
	q: LeadQuery,
	ctx: ListContext,
	timeZone: string,
	batchRows = EXPORT_BATCH_ROWS
): Promise<ReadableStream<Uint8Array>> {
	const s = exportSql(q, ctx);
	const write = exportWriter(timeZone);
	const cursor = client
		.unsafe(s.text, s.params as Param)
		.values()
		.cursor(batchRows)
		[Symbol.asyncIterator]();
	let pending: Promise<IteratorResult<Batch>> = cursor.next() as Promise<IteratorResult<Batch>>;
	let finished = false;
	const ask = () => {
		pending = cursor.next() as Promise<IteratorResult<Batch>>;
		// Handled where it is awaited (pull or cancel); this keeps it from counting as unhandled
		// while the previous batch is written.
		pending.catch(() => undefined);
	};
	const first = await pending;
	if (!first.done) ask();
	return new ReadableStream<Uint8Array>(
		{
			start(controller) {
				controller.enqueue(new TextEncoder().encode(csvLine(EXPORT_COLUMNS)));
				if (first.done) {
					finished = true;
					controller.close();
				} else {
					controller.enqueue(write(first.value));
				}
			},
			async pull(controller) {
				let next: IteratorResult<Batch>;
				try {
					next = await pending;
				} catch (error) {
					if (finished) return;
					finished = true;
					controller.error(error);
					return;
				}
				if (finished) return; // cancelled while the batch was on its way
				if (next.done) {
					finished = true;
					controller.close();
					return;
				}
				ask();
				controller.enqueue(write(next.value));
			},
			async cancel() {
				if (finished) return;
				finished = true;
				// postgres.js closes a cursor from the callback of the batch it delivered last, so a
				// batch still on its way has to arrive first; closing before would leave the
				// connection waiting for a reader that never comes.
				const last = await pending.catch(() => null);
				if (last && !last.done) await cursor.return?.();
			}
		},
		// One chunk (one batch) queued at most: the next is asked for only when it was taken.
		{ highWaterMark: 1 }
	);
}
