// The CSV lines of the leads export, as bytes, from the rows of exportSql. No database, so
// the unit tests run it alone.
import { Buffer } from 'node:buffer';
import { csvCell } from '$lib/csv';
import { whenWriter } from '$lib/firm-time';
import { label, SERVICE_LABELS } from '$lib/schema/leads';

/**
 * A row of exportSql: its line in pieces. PostgreSQL writes the cells it can (`head`, `contact`
 * and `rest`, each with its commas); the app writes the times in the firm's zone (whole minutes
 * since 1970) and the services' labels (from the JSON text of their keys).
 */
export type ExportRow = [
	head: string,
	received: number,
	contact: string,
	services: string,
	rest: string,
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
 * in the firm's zone ("Dec 3, 5:14 PM") and the services' labels. Made for 100,000 rows: no Date
 * per time, no services' cell made twice, and each line goes into the batch's bytes as it is
 * made, so no batch-long string is ever built (on the server's small young generation, a long
 * string outlives several collections and is copied by each).
 */
export function exportWriter(timeZone: string): (rows: readonly ExportRow[]) => Uint8Array {
	const when = whenWriter(timeZone);
	// A time's text always holds a comma, so it is always quoted, and never starts a formula.
	const time = (minutes: number | null) => (minutes === null ? '' : `"${when(minutes * 60_000)}"`);
	const servicesCell = repeatedCells((keys: string) =>
		csvCell((JSON.parse(keys) as string[]).map((key) => label(SERVICE_LABELS, key)).join('; '))
	);
	return (rows) => {
		let bytes: Buffer = Buffer.allocUnsafe(rows.length * BYTES_PER_ROW);
		let at = 0;
		for (const r of rows) {
			const line = `${r[0]}${time(r[1])}${r[2]}${servicesCell(r[3])}${r[4]}${time(r[5])},${time(r[6])}\r\n`;
			// A UTF-16 unit takes at most 3 bytes in UTF-8.
			if (bytes.length - at < line.length * 3) bytes = grown(bytes, at, line.length * 3);
			at += bytes.write(line, at);
		}
		return bytes.subarray(0, at);
	};
}
