// The cells of the price-list CSV files: RFC 4180 reading, writing with formulas neutralised
// ($lib/csv), and the zod cell checks the pump and labor rows share, each message naming its column.
import { z } from 'zod';
import { parseCents } from '$lib/money';
import { csvLine } from '$lib/csv';

export function parseCsv(text: string): string[][] {
	const rows: string[][] = [];
	let row: string[] = [];
	let field = '';
	let quoted = false;
	const src = text.replace(/^\uFEFF/, '');
	for (let i = 0; i < src.length; i++) {
		const ch = src[i];
		if (quoted) {
			if (ch === '"' && src[i + 1] === '"') {
				field += '"';
				i++;
			} else if (ch === '"') quoted = false;
			else field += ch;
		} else if (ch === '"') quoted = true;
		else if (ch === ',') {
			row.push(field);
			field = '';
		} else if (ch === '\n' || ch === '\r') {
			if (ch === '\r' && src[i + 1] === '\n') i++;
			row.push(field);
			rows.push(row);
			row = [];
			field = '';
		} else field += ch;
	}
	if (field !== '' || row.length) {
		row.push(field);
		rows.push(row);
	}
	return rows.filter((r) => r.some((f) => f.trim() !== ''));
}

/** RFC 4180 with every cell a spreadsheet would run as a formula neutralised ($lib/csv). */
export const toCsv = (rows: readonly (readonly unknown[])[]) => rows.map(csvLine).join('');

/** The export put an apostrophe before a cell that starts like a formula; take it off again. */
export const unneutralise = (cell: string) => (/^'[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell);

export interface RowBase {
	line: number;
	/** The row's key: the SKU, the pump id, or kind and id for labor. */
	key: string;
	/** What the preview shows for a good row. */
	label: string;
	detail: string;
	errors: string[];
}

export const idCell = (column: string) =>
	z
		.string()
		.trim()
		.regex(/^[a-z0-9-]{2,40}$/, `${column} must be 2 to 40 lower-case letters, digits or dashes`);

export const nameCell = z
	.string()
	.trim()
	.min(1, 'name is empty')
	.max(120, 'name is over 120 characters');

/** A price-list cell's amount may run to nine whole digits (a catalog is not a job total). */
export const PRICE_DIGITS = { wholeDigits: 9 };

export const dollarsCell = (column: string, example: string) =>
	z
		.string()
		.trim()
		.transform((text, ctx) => {
			const cents = parseCents(text, PRICE_DIGITS);
			if (cents !== null) return cents;
			ctx.addIssue({
				code: 'custom',
				message: text.startsWith('-')
					? `${column} must not be negative`
					: `${column} must be dollars and cents, such as ${example}`
			});
			return z.NEVER;
		});

export const emptyCell = (column: string, why: string) =>
	z.string().trim().max(0, `${column} ${why}: leave it empty`);

export const issues = (error: z.ZodError) => error.issues.map((i) => i.message);
