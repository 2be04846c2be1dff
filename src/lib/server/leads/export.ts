// The leads CSV export as a stream: rows come from a postgres.js cursor in batches and go to the
// response as they come, so memory stays flat whatever the number of rows.
//
// - PostgreSQL makes the next batch while the app writes the last one: the cursor's callback
//   returns at once, asking for the next batch, and the batch it was given is written after that
//   request has left.
// - Back-pressure: the stream holds at most two chunks (the header, then batches), and the app at
//   most three batches in all, with the one on its way. When the stream is full, the callback
//   waits for the reader to take a chunk before asking for the next batch, so a slow client holds
//   the query back instead of filling the app's memory.
// - A client that goes away cancels the stream; the cursor is then closed, which ends the query
//   and gives its connection back to the pool. So does a client that stays but reads nothing for
//   a minute (its download fails).
// - An error after the first byte errors the stream: the server then breaks the connection before
//   the end of the chunked body, so the client sees a failed download, never a short valid file.
//
// The callback form of postgres.js's cursor, not its async iterator: with the iterator, nearly
// every row outlived two young-generation collections and was promoted (about 35 MB of rows per
// 100,000 were promoted against 4 MB with the callback, `--trace-gc-nvp`), which cost the
// server most of its time in garbage collection.
import { csvLine } from '$lib/csv';
import type { LeadQuery } from '$lib/schema/leads';
import { client } from '../platform/db';
import { EXPORT_COLUMNS, exportSql } from './export-sql';
import { exportWriter, type ExportRow } from './export-lines';
import type { ListContext } from './list-sql';

/** Rows per cursor batch: about 100 KB of CSV, one round trip per batch. */
export const EXPORT_BATCH_ROWS = 500;

/**
 * How long the cursor waits for a reader that takes nothing before the export is given up: a
 * client that stays connected but stopped reading would otherwise hold one of the pool's few
 * connections (and its lock on the leads table) for as long as it stays.
 */
export const EXPORT_STALL_MS = 60_000;

const stallError = (ms: number) =>
	new Error(`The export was stopped: its reader took nothing for ${Math.round(ms / 1000)} s`);

/** Chunks the stream holds before the cursor waits for the reader: the header, then batches. */
const QUEUED_CHUNKS = 2;

type Param = Parameters<typeof client.unsafe>[1];

/**
 * Resolves after postgres.js has sent what the cursor's callback asked for: it sends from an
 * immediate of its own, queued once the callback has returned, so the second immediate from now
 * comes after it.
 */
const afterNextRequest = () =>
	new Promise<void>((resolve) => setImmediate(() => setImmediate(resolve)));
/** What the cursor's callback may answer: nothing (go on) or postgres.js's CLOSE. */
type Answer = undefined | typeof client.CLOSE;

/**
 * Starts the export of a filtered view and waits for its first batch, so that a query that
 * cannot start (database down, bad time zone) fails as an ordinary error response, before any
 * byte of the file was sent. The stream begins with the header row, even for an empty view.
 */
export async function leadsCsvStream(
	q: LeadQuery,
	ctx: ListContext,
	timeZone: string,
	{ batchRows = EXPORT_BATCH_ROWS, stallMs = EXPORT_STALL_MS } = {}
): Promise<ReadableStream<Uint8Array>> {
	const s = exportSql(q, ctx);
	const write = exportWriter(timeZone);
	let controller!: ReadableStreamDefaultController<Uint8Array>;
	let finished = false;
	let room: (() => void) | null = null;
	let stalled: ReturnType<typeof setTimeout> | undefined;
	const finish = (end: () => void) => {
		if (finished) return;
		finished = true;
		end();
		room?.();
	};
	const stream = new ReadableStream<Uint8Array>(
		{
			start(c) {
				controller = c;
				c.enqueue(new TextEncoder().encode(csvLine(EXPORT_COLUMNS)));
			},
			pull() {
				room?.();
				room = null;
			},
			cancel() {
				finish(() => undefined);
			}
		},
		{ highWaterMark: QUEUED_CHUNKS }
	);

	let firstBatch: () => void = () => undefined;
	const started = new Promise<void>((resolve) => (firstBatch = resolve));
	// Each batch is written in turn, after the request for the next one has left.
	let writes = Promise.resolve();
	let unwritten = 0;
	const onBatch = (rows: ExportRow[]): Answer | Promise<Answer> => {
		if (finished) return client.CLOSE;
		firstBatch();
		unwritten++;
		writes = writes
			.then(afterNextRequest)
			.then(() => {
				unwritten--;
				if (!finished) controller.enqueue(write(rows));
			})
			.catch((error: unknown) => finish(() => controller.error(error)));
		// Once the batches not yet written are in, is there room for the one asked for now?
		if (unwritten < (controller.desiredSize ?? 0)) return undefined;
		return new Promise<void>((resolve) => {
			stalled = setTimeout(() => finish(() => controller.error(stallError(stallMs))), stallMs);
			room = () => {
				clearTimeout(stalled);
				resolve();
			};
		}).then(() => (finished ? client.CLOSE : undefined));
	};
	const query = client
		.unsafe(s.text, s.params as Param)
		.values()
		.cursor(batchRows, onBatch as (rows: unknown[]) => void);
	// Once the query has settled, the cursor must not be woken: answering CLOSE to a connection
	// that died would make postgres.js write to a socket it has already dropped.
	const settled = (end: () => void) => {
		clearTimeout(stalled);
		room = null;
		finish(end);
	};
	query.then(
		() => writes.then(() => settled(() => controller.close())),
		(error: unknown) => settled(() => controller.error(error))
	);
	await Promise.race([started, query]);
	return stream;
}
