// The leads CSV export streamed from a database cursor: more rows than one batch, compared with
// the database cell by cell; an empty view; a client that goes away; a connection that dies.
import { beforeEach, describe, expect, it } from 'vitest';
import postgres from 'postgres';
import { csvLine } from '$lib/csv';
import { db } from '$lib/server/platform/db';
import { contacts, leads, properties } from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import { EXPORT_BATCH_ROWS, leadsCsvStream } from '$lib/server/leads/export';
import { EXPORT_COLUMNS } from '$lib/server/leads/export-sql';
import {
	BUDGET_LABELS,
	SERVICE_LABELS,
	STAGE_LABELS,
	label,
	parseLeadQuery
} from '$lib/schema/leads';
import { formatWhen } from '$lib/components/leads/format';
import type { SessionUser } from '$lib/server/auth/sessions';
import { GET as csvGet } from '../../src/routes/office/leads/export.csv/+server';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';

const LEADS = 4_345; // more than two batches, and not a multiple of one
const TIME_ZONE = 'America/Denver'; // the settings' default; crosses two DST changes below

// Names and towns that a CSV writer gets wrong: quotes, commas, line breaks, formula starts,
// accents, apostrophes and hyphens.
const NAMES = [
	'Ada Brookstone',
	'Zoë Ångström-Lefèvre',
	"Siobhán O'Rourke",
	'=HYPERLINK("http://evil.example","x")',
	'+1 Caller',
	'-minus Person',
	'@at Person',
	'Comma, Person',
	'Quote "Q" Person',
	'Line\nBreak Person',
	'Tab\tStart'
];
const TOWNS = ['Alder Crossing', 'Lake, "North"', 'Saint-Étienne-du-Lac', ''];
const SERVICES = [[], ['water-feature'], ['pond', 'lighting'], ['patio', 'unknown_key']];
const BUDGETS = [...Object.keys(BUDGET_LABELS), 'odd_budget'];
const STAGES = Object.keys(STAGE_LABELS) as (keyof typeof STAGE_LABELS)[];

type Staff = Awaited<ReturnType<typeof makeUser>>;
let owner: Staff;

function event(path: string, user: Staff) {
	const url = new URL(path, 'http://127.0.0.1');
	return {
		url,
		locals: { user: { ...user } as SessionUser },
		request: new Request(url)
	} as never;
}

/** RFC 4180: quoted fields may hold commas, CRLF and doubled quotes; lines end in CRLF. */
function parseCsv(text: string): string[][] {
	const rows: string[][] = [];
	let row: string[] = [];
	let cell = '';
	let quoted = false;
	for (let i = 0; i < text.length; i++) {
		const ch = text[i];
		if (quoted) {
			if (ch === '"' && text[i + 1] === '"') {
				cell += '"';
				i++;
			} else if (ch === '"') quoted = false;
			else cell += ch;
		} else if (ch === '"') quoted = true;
		else if (ch === ',') {
			row.push(cell);
			cell = '';
		} else if (ch === '\r' && text[i + 1] === '\n') {
			row.push(cell);
			rows.push(row);
			row = [];
			cell = '';
			i++;
		} else cell += ch;
	}
	expect(cell).toBe(''); // nothing after the last CRLF
	expect(row).toEqual([]);
	return rows;
}

async function bulkLeads(n: number, assigneeId: string) {
	const start = Date.UTC(2026, 0, 1, 6, 59);
	for (let from = 0; from < n; from += 1000) {
		const people = [];
		const places = [];
		const rows = [];
		for (let i = from; i < Math.min(n, from + 1000); i++) {
			const contactId = newId();
			const propertyId = newId();
			// A spread of times over a year and a bit, at odd minutes, so both DST changes and
			// noon and midnight come up.
			const createdAt = new Date(start + i * 2_953_000 * 3);
			people.push({
				id: contactId,
				name: `${NAMES[i % NAMES.length]} ${i}`,
				email: i % 7 === 0 ? null : `p${i}@export.test.example`,
				phone: i % 5 === 0 ? null : `+1 555 01${String(i).padStart(4, '0')}`
			});
			places.push({ id: propertyId, contactId, street: `${i} Row`, town: TOWNS[i % TOWNS.length] });
			rows.push({
				id: newId(),
				contactId,
				propertyId: i % 11 === 0 ? null : propertyId,
				stage: STAGES[i % STAGES.length],
				closeReason: STAGES[i % STAGES.length] === 'closed' ? ('budget' as const) : null,
				services: SERVICES[i % SERVICES.length],
				budget: BUDGETS[i % BUDGETS.length],
				source: i % 3 ? 'website' : 'referral',
				priority: (['low', 'normal', 'high'] as const)[i % 3],
				assigneeId: i % 2 ? assigneeId : null,
				createdAt,
				lastTouchAt: new Date(createdAt.getTime() + 3_600_000),
				firstReplyAt: i % 4 ? new Date(createdAt.getTime() + 1_800_000) : null
			});
		}
		await db.insert(contacts).values(people);
		await db.insert(properties).values(places);
		await db.insert(leads).values(rows);
	}
}

/** The file as the export wrote it before it streamed: every cell from the raw row, in JS. */
async function expectedFile(): Promise<string> {
	const raw = await db.execute<{
		number: number;
		created_at: string;
		name: string;
		email: string | null;
		phone: string | null;
		town: string | null;
		services: string[];
		budget: string;
		stage: keyof typeof STAGE_LABELS;
		close_reason: string | null;
		assignee: string | null;
		priority: string;
		source: string;
		first_reply_at: string | null;
		last_touch_at: string;
	}>(
		`select l.number, l.created_at, c.name, c.email, c.phone, p.town, l.services, l.budget,
		l.stage, l.close_reason, u.name as assignee, l.priority, l.source, l.first_reply_at,
		l.last_touch_at
		from leads l join contacts c on c.id = l.contact_id
		left join properties p on p.id = l.property_id left join users u on u.id = l.assignee_id
		order by l.created_at desc, l.number desc` as never
	);
	// The header's words are checked on their own (the empty view's test).
	const header = csvLine(EXPORT_COLUMNS);
	const body = [...raw].map((r) =>
		csvLine([
			`R-${r.number}`,
			formatWhen(r.created_at, TIME_ZONE),
			r.name,
			r.email,
			r.phone,
			r.town,
			r.services.map((s) => label(SERVICE_LABELS, s)).join('; '),
			label(BUDGET_LABELS, r.budget),
			STAGE_LABELS[r.stage],
			r.close_reason,
			r.assignee,
			r.priority,
			r.source,
			r.first_reply_at ? formatWhen(r.first_reply_at, TIME_ZONE) : '',
			formatWhen(r.last_touch_at, TIME_ZONE)
		])
	);
	return header + body.join('');
}

/**
 * The app's pool connections (postgres.js names them) and whether each is busy. A cursor waiting
 * between two batches shows as "idle" in pg_stat_activity, but its transaction still holds its
 * lock on the leads table until the cursor is closed.
 */
async function poolBackends(check: postgres.Sql) {
	return check<{ pid: number; busy: boolean; query: string }[]>`
		select a.pid, a.query, exists (
			select 1 from pg_locks k where k.pid = a.pid and k.relation = 'leads'::regclass
		) as busy
		from pg_stat_activity a
		where a.datname = current_database() and a.application_name = 'postgres.js'`;
}
const runningExport = (b: { busy: boolean; query: string }) =>
	b.busy && b.query.startsWith('/* leads export */');

/**
 * The route's stream in batches of 500 rows: after the first chunk (the header) is read, at most
 * two batches wait in the stream and one is on its way, so most of the 4,345 rows are still in
 * the database.
 */
const smallBatches = (stallMs?: number) =>
	leadsCsvStream(parseLeadQuery(new URLSearchParams()).data!, { userId: owner.id }, TIME_ZONE, {
		batchRows: 500,
		stallMs
	});

/**
 * An export of LEADS rows in small batches whose first chunk (the header) was read, with a
 * connection of its own to watch the app's pool from; both closed afterwards.
 */
async function withOpenExport(
	run: (reader: ReadableStreamDefaultReader<Uint8Array>, check: postgres.Sql) => Promise<void>,
	stallMs?: number
) {
	await bulkLeads(LEADS, owner.id);
	const check = postgres(process.env.DATABASE_URL!, {
		max: 1,
		onnotice: () => {},
		connection: { application_name: 'export-test-check' }
	});
	const reader = (await smallBatches(stallMs)).getReader();
	try {
		expect((await reader.read()).done).toBe(false);
		await run(reader, check);
	} finally {
		await reader.cancel().catch(() => undefined);
		await check.end();
	}
}

async function waitUntil(what: () => Promise<boolean>, ms = 5000) {
	const end = Date.now() + ms;
	while (Date.now() < end) {
		if (await what()) return true;
		await new Promise((r) => setTimeout(r, 50));
	}
	return false;
}

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	owner = await makeUser('owner');
});

describe('the streamed leads CSV export', () => {
	it('exports more rows than one batch, every cell as the database holds it', async () => {
		expect(LEADS).toBeGreaterThan(2 * EXPORT_BATCH_ROWS);
		await bulkLeads(LEADS, owner.id);
		const res = await csvGet(event('/office/leads/export.csv', owner));
		expect(res.status).toBe(200);
		const text = await res.text();
		const file = parseCsv(text);
		const expectedText = await expectedFile();
		const expected = parseCsv(expectedText);
		expect(file).toHaveLength(LEADS + 1);
		for (let i = 0; i < expected.length; i++) expect(file[i], `line ${i + 1}`).toEqual(expected[i]);
		// Cell for cell, and byte for byte: the same quoting too.
		expect(text).toBe(expectedText);
		// Spot checks a person would make in a spreadsheet.
		expect(text).toContain(`"'=HYPERLINK(""http://evil.example"",""x"")`);
		expect(text).toContain('Zoë Ångström-Lefèvre');
		expect(text).toContain('"Lake, ""North"""');
		expect(text).toContain('Pond; Lighting');
		expect(text).toContain('Patio or paths; unknown key');
	});

	it('keeps the filters and sort of the view', async () => {
		await bulkLeads(300, owner.id);
		const res = await csvGet(
			event('/office/leads/export.csv?stage=new&service=pond&sort=name&dir=asc', owner)
		);
		const file = parseCsv(await res.text());
		const names = await db.execute<{ number: number }>(
			`select l.number from leads l join contacts c on c.id = l.contact_id
			where l.stage = 'new' and l.services && array['pond']
			order by l.sort_name asc, l.number asc` as never
		);
		expect(file.slice(1).map((r) => r[0])).toEqual([...names].map((r) => `R-${r.number}`));
		expect(file.length).toBeGreaterThan(1);
	});

	it('sends the header row for an empty view', async () => {
		const res = await csvGet(event('/office/leads/export.csv', owner));
		expect(res.status).toBe(200);
		const text = await res.text();
		expect(text).toBe(
			'Number,Received,Name,E-mail,Phone,Town,Services,Budget,Stage,Close reason,Assignee,Priority,Source,First reply,Last touch\r\n'
		);
	});

	it('stops the query and gives the connection back when the client goes away', async () => {
		await withOpenExport(async (reader, check) => {
			// The export's query is still open on one of the pool's connections…
			expect((await poolBackends(check)).some(runningExport)).toBe(true);
			await reader.cancel();
			// …and after the client left, every pool connection is idle again, ready for others.
			expect(
				await waitUntil(async () => {
					const backends = await poolBackends(check);
					return backends.length > 0 && backends.every((b) => !b.busy);
				})
			).toBe(true);
			const again = await csvGet(event('/office/leads/export.csv?stage=sold', owner));
			expect(parseCsv(await again.text()).length).toBeGreaterThan(1);
		});
	});

	it('holds the query back while the client reads nothing, then sends every row', async () => {
		await withOpenExport(async (reader, check) => {
			// Unread, the query would have sent all 4,345 rows within a fraction of this.
			await new Promise((r) => setTimeout(r, 1000));
			expect((await poolBackends(check)).some(runningExport)).toBe(true);
			let text = '';
			const decoder = new TextDecoder();
			for (;;) {
				const { done, value } = await reader.read();
				if (done) break;
				text += decoder.decode(value, { stream: true });
			}
			expect(parseCsv(text)).toHaveLength(LEADS);
			const ended = async () => !(await poolBackends(check)).some(runningExport);
			expect(await waitUntil(ended)).toBe(true);
		});
	});

	it('gives the connection back when the client stays but stops reading', async () => {
		await withOpenExport(async (reader, check) => {
			const ended = async () => !(await poolBackends(check)).some(runningExport);
			expect(await waitUntil(ended)).toBe(true);
			await expect(
				(async () => {
					for (;;) if ((await reader.read()).done) break;
				})()
			).rejects.toThrow(/took nothing for 1 s/);
		}, 1000);
	});

	it('fails the download, never a short valid file, when the connection dies mid-export', async () => {
		await withOpenExport(async (reader, check) => {
			const exporting = (await poolBackends(check)).filter(runningExport);
			expect(exporting).toHaveLength(1);
			await check`select pg_terminate_backend(${exporting[0].pid})`;
			let failed: unknown = null;
			try {
				for (;;) if ((await reader.read()).done) break;
			} catch (error) {
				failed = error;
			}
			expect(failed).toBeInstanceOf(Error);
		});
	});

	it('fails the download when the connection dies while the export waits for its reader', async () => {
		// A database restart during a slow download: the cursor is parked, waiting for room.
		await withOpenExport(async (reader, check) => {
			await new Promise((r) => setTimeout(r, 300));
			const [exporting] = (await poolBackends(check)).filter(runningExport);
			await check`select pg_terminate_backend(${exporting.pid})`;
			const gone = async () => !(await poolBackends(check)).some((b) => b.pid === exporting.pid);
			expect(await waitUntil(gone)).toBe(true);
			await new Promise((r) => setTimeout(r, 200));
			await expect(
				(async () => {
					for (;;) if ((await reader.read()).done) break;
				})()
			).rejects.toThrow();
			// The server process is still up and exports again.
			const again = await csvGet(event('/office/leads/export.csv?stage=sold', owner));
			expect(parseCsv(await again.text()).length).toBeGreaterThan(1);
		});
	});
});
