// CSV (RFC 4180): fields with a comma, quote, CR or LF are quoted, quotes doubled, lines end
// in CRLF. A cell that a spreadsheet would run as a formula (starting with =, +, -, @, or a tab
// or CR that hides one) gets a leading apostrophe, so opening the export runs nothing.

// Their sources are also PostgreSQL regular expressions of the same meaning (csv-sql.ts).
export const FORMULA_START = /^[=+\-@\t\r]/;
export const NEEDS_QUOTES = /[",\r\n]/;
/** A formula start or a character that needs quotes: most values have neither, and are their cell. */
export const NEEDS_RULES = new RegExp(`${FORMULA_START.source}|${NEEDS_QUOTES.source}`);

export function csvCell(value: unknown): string {
	if (value === null || value === undefined) return '';
	let text = value instanceof Date ? value.toISOString() : String(value);
	if (!NEEDS_RULES.test(text)) return text;
	if (FORMULA_START.test(text)) text = `'${text}`;
	return NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvLine(cells: readonly unknown[]): string {
	return cells.map(csvCell).join(',') + '\r\n';
}
