import { describe, expect, it } from 'vitest';
import { csvCell, csvLine } from '$lib/csv';
import { inZone } from '$lib/firm-time';
import { label, SERVICE_LABELS } from '$lib/schema/leads';
import { exportWriter, type ExportRow } from './export-lines';

const ZONE = 'America/Denver';
const minutes = (iso: string) => Date.parse(iso) / 60_000;

/** A lead's values as the office shows them, before any is a cell. */
interface Lead {
	number: number;
	received: number;
	contact: (string | null)[];
	services: string[];
	rest: (string | null)[];
	firstReply: number | null;
	lastTouch: number;
}

const lead = (overrides: Partial<Lead> = {}): Lead => ({
	number: 1042,
	received: minutes('2027-03-14T08:59:00Z'), // the morning daylight saving starts in Denver
	contact: ['Ada Brookstone', 'ada@example.test', '555-0100', 'Cedar Falls'],
	services: ['pond', 'lighting'],
	rest: ['$15,000 to $30,000', 'New', null, 'Sam Sales', 'normal', 'web'],
	firstReply: null,
	lastTouch: minutes('2027-11-07T09:30:00Z'), // the morning it ends
	...overrides
});

/** The row exportSql sends: the cells PostgreSQL writes (as csvCell does), times and services raw. */
const row = (l: Lead): ExportRow => [
	`R-${l.number},`,
	l.received,
	`,${l.contact.map(csvCell).join(',')},`,
	JSON.stringify(l.services),
	`,${l.rest.map(csvCell).join(',')},`,
	l.firstReply,
	l.lastTouch
];

/** The line as the office's own helpers write each cell (csvLine, label, inZone). */
function expectedLine(l: Lead): string {
	const when = (m: number | null) => (m === null ? '' : inZone(m * 60_000, ZONE, 'when'));
	return csvLine([
		`R-${l.number}`,
		when(l.received),
		...l.contact,
		l.services.map((s) => label(SERVICE_LABELS, s)).join('; '),
		...l.rest,
		when(l.firstReply),
		when(l.lastTouch)
	]);
}

const written = (leads: Lead[]) => Buffer.from(exportWriter(ZONE)(leads.map(row))).toString('utf8');

describe('the export’s CSV lines', () => {
	it('write times in the firm’s zone and services as labels, between PostgreSQL’s cells', () => {
		const leads = [
			lead(),
			lead({
				contact: ['=HYPERLINK("http://evil.example","x")', null, '+1 555 0100', 'Lake, "North"'],
				firstReply: minutes('2027-06-01T18:05:00Z')
			}),
			lead({ services: ['patio', 'unknown_key'], rest: ['', 'New', 'no budget', null, 'low', ''] }),
			lead({ services: [], received: minutes('2026-12-31T23:59:00Z') })
		];
		const text = written(leads);
		expect(text).toBe(leads.map(expectedLine).join(''));
		expect(text).toContain(`${SERVICE_LABELS.patio}; unknown key`);
		expect(text).toContain('R-1042,"Mar 14, 1:59 AM",Ada Brookstone,');
		expect(text).toContain(',"Dec 31, 4:59 PM",');
	});

	it('reads labels from the map’s own keys only, as the database holds them', () => {
		expect(written([lead({ services: ['constructor', 'toString'] })])).toContain(
			',constructor; toString,'
		);
	});

	it('quotes a services cell that needs it, and reads the keys as PostgreSQL writes them', () => {
		const l = lead({ services: ['pond', 'a "quoted", key', 'back\\slash', 'tab\there'] });
		const r = row(l);
		// array_to_json escapes as JSON does; the writer reads the text, not the spacing.
		r[3] = '["pond","a \\"quoted\\", key","back\\\\slash","tab\\there"]';
		const text = Buffer.from(exportWriter(ZONE)([r])).toString('utf8');
		expect(text).toBe(expectedLine(l));
		expect(text).toContain(',"Pond; a ""quoted"", key; back\\slash; tab\there",');
	});

	it('grows its buffer for lines longer than a batch was given room for', () => {
		const long = '🌊'.repeat(3000) + ' Pond, "deep"';
		const leads = [
			lead({ contact: [long, null, null, null] }),
			lead({ contact: ['x', null, null, 'é'.repeat(5000)] }),
			lead()
		];
		expect(written(leads)).toBe(leads.map(expectedLine).join(''));
	});
});
