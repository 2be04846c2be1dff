// The CSV lines of the leads export, as bytes, from the raw rows of exportSql. No database, so
// the unit tests run it alone.
import { Buffer } from 'node:buffer';
import { csvCell } from '$lib/csv';
import { whenWriter } from '$lib/firm-time';
import { BUDGET_LABELS, label, SERVICE_LABELS, STAGE_LABELS } from '$lib/schema/leads';

/**
 * A row of exportSql: the values of EXPORT_COLUMNS, times in whole minutes since 1970. It comes as
 * its JSON text and is parsed only when its line is written.
 */
export type ExportRow = [
	number: number,
	received: number,
	name: string,
	email: string | null,
	phone: string | null,
	town: string | null,
	services: string[],
	budget: string | null,
	stage: string,
	closeReason: string | null,
	assignee: string | null,
	priority: string,
	source: string,
	firstReply: number | null,
	lastTouch: number
];

/** Room per row at first: a line is about 210 bytes; a longer batch grows its buffer. */
const BYTES_PER_ROW = 320;

/** A copy of the first `used` bytes in a buffer with room for `more` after them. */
function grown(bytes: Buffer, used: number, more: number) {
	const larger = Buffer.allocUnsafe(Math.max(bytes.length * 2, used + more));
	bytes.copy(larger, 0, 0, used);
	return larger;
}

/**
 * The cells of values that repeat from row to row (labels, assignees, sources), each made once.
 * At most `max` are kept, so a column of distinct values costs no more than making each.
 */
function repeatedCells<K>(cellOf: (key: K) => string, max = 1000): (key: K) => string {
	const cells = new Map<K, string>();
	return (key) => {
		let cell = cells.get(key);
		if (cell === undefined) {
			cell = cellOf(key);
			if (cells.size < max) cells.set(key, cell);
		}
		return cell;
	};
}

/**
 * Writes rows of exportSql as CSV lines, as `csvLine` writes the cells the office shows: times
 * in the firm's zone ("Dec 3, 5:14 PM"), labels instead of keys, formulas neutralised. Made for
 * 100,000 rows: a row is parsed only as its line is written (its values die young), no Date per
 * time, no label looked up twice, and each line goes into the batch's
 * bytes as it is made, so no batch-long string is ever built (on the server's small young
 * generation, a long string outlives several collections and is copied by each).
 */
export function exportWriter(timeZone: string): (rows: readonly string[]) => Uint8Array {
	const when = whenWriter(timeZone);
	// A time's text always holds a comma, so it is always quoted, and never starts a formula.
	const time = (minutes: number | null) => (minutes === null ? '' : `"${when(minutes * 60_000)}"`);
	const labelCell = (labels: Record<string, string>) =>
		repeatedCells((key: string | null) => csvCell(label(labels, key)));
	// Keyed by the keys joined with NUL, which no PostgreSQL text can hold.
	const servicesCell = repeatedCells((keys: string) =>
		csvCell(
			keys
				? keys
						.split('\0')
						.map((key) => label(SERVICE_LABELS, key))
						.join('; ')
				: ''
		)
	);
	const budget = labelCell(BUDGET_LABELS);
	const stage = labelCell(STAGE_LABELS);
	const repeated = repeatedCells(csvCell);
	return (rows) => {
		let bytes: Buffer = Buffer.allocUnsafe(rows.length * BYTES_PER_ROW);
		let at = 0;
		for (const text of rows) {
			const r = JSON.parse(text) as ExportRow;
			const line = `R-${r[0]},${time(r[1])},${csvCell(r[2])},${csvCell(r[3])},${csvCell(r[4])},${csvCell(r[5])},${servicesCell(r[6].join('\0'))},${budget(r[7])},${stage(r[8])},${repeated(r[9])},${repeated(r[10])},${repeated(r[11])},${repeated(r[12])},${time(r[13])},${time(r[14])}\r\n`;
			// A UTF-16 unit takes at most 3 bytes in UTF-8.
			if (bytes.length - at < line.length * 3) bytes = grown(bytes, at, line.length * 3);
			at += bytes.write(line, at);
		}
		return bytes.subarray(0, at);
	};
}
