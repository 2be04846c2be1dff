// csvCell as SQL (CsvCellsSql) against csvCell itself, in the real PostgreSQL: the leads export's
// cells are written by the one and checked by the other, so they must agree on every text.
// The rules: RFC 4180 section 2 (a field with a comma, quote, CR or LF is quoted, quotes
// doubled) and OWASP's "CSV Injection" page (a cell starting with =, +, -, @, tab or CR gets a
// leading apostrophe).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvCell } from '$lib/csv';
import { label } from '$lib/schema/leads';
import { client } from '$lib/server/platform/db';
import { CsvCellsSql } from '$lib/server/platform/csv-sql';

/** Each text's cell as PostgreSQL writes it, in one statement. */
async function cellsInSql(
	texts: (string | null)[],
	cell: (csv: CsvCellsSql, value: string) => string
): Promise<string[]> {
	const params: unknown[] = [];
	const add = (v: unknown) => (params.push(v), `$${params.length}`);
	const csv = new CsvCellsSql(add);
	const list = add(texts);
	const rows = await client.unsafe<{ cell: string }[]>(
		`select ${cell(csv, 'x')} as cell from unnest(${list}::text[]) with ordinality as t(x, n) order by n`,
		params as never[]
	);
	return rows.map((r) => r.cell);
}

// The characters the rules turn on, and some that they must leave alone.
const TRICKY = [
	'',
	'Linden Ford',
	'Quill, Mara',
	'the "big" boulder',
	'=SUM(A1:A9)',
	'+1 555 0100',
	'-minus',
	'@handle',
	'\tTabbed',
	'\rCarriage',
	'line one\nline two',
	'\r\n',
	'=HYPERLINK("http://evil.example","x")',
	"O'Rourke",
	'Zoë Ångström-Lefèvre',
	'🌊 Pond',
	'back\\slash',
	'a ^ caret',
	'[brackets]',
	'x=1',
	' =leading space',
	'"',
	','
];

describe('csvCell as SQL', () => {
	it('writes every tricky text and null as csvCell does', async () => {
		const texts = [...TRICKY, null];
		expect(await cellsInSql(texts, (csv, x) => csv.cell(x))).toEqual(texts.map(csvCell));
	});

	it('agrees with csvCell on any text PostgreSQL can hold', async () => {
		// PostgreSQL text holds no NUL and no lone surrogate (it is valid UTF-8).
		const char = fc.oneof(
			fc.constantFrom('=', '+', '-', '@', '\t', '\r', '\n', '"', ',', "'", ' ', '\\', 'é', '🌊'),
			fc.string({ unit: 'grapheme', minLength: 1, maxLength: 1 })
		);
		const text = fc
			.array(char, { maxLength: 12 })
			.map((chars) => chars.join('').replace(/\0/g, ''));
		await fc.assert(
			fc.asyncProperty(fc.array(text, { minLength: 1, maxLength: 40 }), async (texts) => {
				expect(await cellsInSql(texts, (csv, x) => csv.cell(x))).toEqual(texts.map(csvCell));
			}),
			{ numRuns: 60 }
		);
	});

	it('writes a key’s label as csvCell(label(…)) does, unknown keys in words', async () => {
		const labels = { small: 'Under $5,000', plain: 'Not sure yet', quoted: 'The "big" one' };
		const keys = ['small', 'plain', 'quoted', 'odd_key', '=odd_formula', 'constructor', '', null];
		expect(await cellsInSql(keys, (csv, x) => csv.labelCell(x, labels))).toEqual(
			keys.map((k) => csvCell(label(labels, k)))
		);
	});

	it('writes an enum’s values as csvCell does, when none needs a rule and when some do', async () => {
		for (const values of [
			['low', 'normal', 'high'],
			['a,b', '=c', 'plain', 'say "hi"']
		]) {
			const column = [...values, null];
			expect(await cellsInSql(column, (csv, x) => csv.enumCell(x, values))).toEqual(
				column.map(csvCell)
			);
		}
	});
});
