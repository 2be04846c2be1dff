import { describe, expect, it } from 'vitest';
import { csvLine } from '$lib/csv';
import { inZone } from '$lib/firm-time';
import { BUDGET_LABELS, label, SERVICE_LABELS, STAGE_LABELS } from '$lib/schema/leads';
import { exportWriter, type ExportRow } from './export-lines';

const ZONE = 'America/Denver';
const minutes = (iso: string) => Date.parse(iso) / 60_000;

/** The line as the office's own helpers write each cell (csvLine, label, inZone). */
function expectedLine(r: ExportRow): string {
	const when = (m: number | null) => (m === null ? '' : inZone(m * 60_000, ZONE, 'when'));
	return csvLine([
		`R-${r[0]}`,
		when(r[1]),
		r[2],
		r[3],
		r[4],
		r[5],
		r[6].map((s) => label(SERVICE_LABELS, s)).join('; '),
		label(BUDGET_LABELS, r[7]),
		label(STAGE_LABELS, r[8]),
		r[9],
		r[10],
		r[11],
		r[12],
		when(r[13]),
		when(r[14])
	]);
}

const row = (overrides: Partial<Record<number, unknown>> = {}): ExportRow => {
	const base: ExportRow = [
		1042,
		minutes('2027-03-14T08:59:00Z'), // the morning daylight saving starts in Denver
		'Ada Brookstone',
		'ada@example.test',
		'555-0100',
		'Cedar Falls',
		['pond', 'lighting'],
		'15k-30k',
		'new',
		null,
		'Sam Sales',
		'normal',
		'web',
		null,
		minutes('2027-11-07T09:30:00Z') // the morning it ends
	];
	for (const [i, v] of Object.entries(overrides)) (base as unknown[])[Number(i)] = v;
	return base;
};

/** A row as exportSql sends it: the JSON text of its values. */
const json = (r: ExportRow) => JSON.stringify(r);

describe('the export’s CSV lines', () => {
	it('write each cell as the office’s helpers do, times in the firm’s zone', () => {
		const write = exportWriter(ZONE);
		const rows = [
			row(),
			row({
				2: '=HYPERLINK("http://evil.example","x")',
				5: 'Lake, "North"',
				13: minutes('2027-06-01T18:05:00Z')
			}),
			row({ 2: 'Zoë Ångström-Lefèvre', 6: ['patio', 'unknown_key'], 7: null, 9: 'no_budget' }),
			row({ 2: 'Line one\nline two', 3: null, 4: '+1 555 0100', 6: [], 10: null, 12: '@partner' })
		];
		const text = Buffer.from(write(rows.map(json))).toString('utf8');
		expect(text).toBe(rows.map(expectedLine).join(''));
		expect(text).toContain(`"'=HYPERLINK(""http://evil.example"",""x"")"`);
		expect(text).toContain('"Lake, ""North"""');
		expect(text).toContain(`${SERVICE_LABELS.patio}; unknown key`);
		expect(text).toContain('"$15,000 to $30,000"');
	});

	it('reads labels from the maps’ own keys only, as the database holds them', () => {
		const line = Buffer.from(
			exportWriter(ZONE)([json(row({ 6: ['constructor'], 7: 'toString' }))])
		);
		expect(line.toString('utf8')).toContain(',constructor,toString,');
	});

	it('grows its buffer for lines longer than a batch was given room for', () => {
		const write = exportWriter(ZONE);
		const long = '🌊'.repeat(3000) + ' Pond, "deep"';
		const rows = [row({ 2: long }), row({ 5: 'é'.repeat(5000) }), row()];
		expect(Buffer.from(write(rows.map(json))).toString('utf8')).toBe(
			rows.map(expectedLine).join('')
		);
	});

	it('reads rows as PostgreSQL writes them, every JSON escape decoded', () => {
		// json_build_array puts a space after each comma; control characters, quotes and
		// backslashes come escaped, a lone surrogate too.
		const spaced = (r: ExportRow) =>
			`[${r.map((v) => (Array.isArray(v) ? `[${v.map((x) => JSON.stringify(x)).join(', ')}]` : JSON.stringify(v))).join(', ')}]`;
		const rows = [
			row({ 2: '\tTabbed', 3: 'a\\b@x.example', 4: 'bell\u0007, "ring"', 5: '\rCR town' }),
			row({
				2: '-5 apples',
				5: 'Back\bspace\fform',
				6: ['pond', 'a "quoted", key'],
				10: 'Zoë "Z"'
			}),
			row({ 2: 'lone \ud800 half', 5: null, 12: 'web, ads' })
		];
		const written = Buffer.from(exportWriter(ZONE)(rows.map(spaced)));
		// As bytes: a lone surrogate is written as U+FFFD, as Buffer writes any string.
		expect(written).toEqual(Buffer.from(rows.map(expectedLine).join(''), 'utf8'));
		expect(written.toString('utf8')).toContain(
			`'\tTabbed,a\\b@x.example,"bell\u0007, ""ring""","'\rCR town"`
		);
	});
});
