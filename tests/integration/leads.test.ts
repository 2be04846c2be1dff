// The leads API, list query, edits and Today, against the real database and stand-ins.
import { beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { client, db } from '$lib/server/platform/db';
import { activities, leads, outbox } from '$lib/server/platform/db/schema';
import { parseLeadQuery } from '$lib/schema/leads';
import {
	assignLead,
	changeStage,
	LeadConflictError,
	listLeads,
	listSql,
	logActivity,
	todaySummary
} from '$lib/server/leads/leads';
import { KEPT_MATCHES, type PageStart } from '$lib/server/leads/list-sql';
import { sendLeadMail } from '$lib/server/leads/mail';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import type { SessionUser } from '$lib/server/auth/sessions';
import { GET as apiGet } from '../../src/routes/api/leads/+server';
import { GET as csvGet } from '../../src/routes/office/leads/export.csv/+server';
import { resetDatabase } from '../support/database';
import { clearMail, waitForMail } from '../support/mailbox';
import { makeLead, makeUser, seedFirm } from './fixtures';

const HOUR = 3_600_000;
const ago = (h: number) => new Date(Date.now() - h * HOUR);

type Staff = Awaited<ReturnType<typeof makeUser>>;
let owner: Staff;
let sales: Staff;
let crew: Staff;
let set: Record<'ada' | 'ben' | 'cora' | 'dev', Awaited<ReturnType<typeof makeLead>>>;

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	owner = await makeUser('owner');
	sales = await makeUser('sales');
	crew = await makeUser('crew');
	set = {
		ada: await makeLead({
			name: 'Ada Brookstone',
			email: 'ada.brook@test.example',
			phone: '(555) 010-2222',
			town: 'Alder Crossing',
			message: 'A bubbling boulder near the patio',
			services: ['water-feature'],
			budget: '5k-15k',
			createdAt: ago(72)
		}),
		ben: await makeLead({
			name: 'Ben Cattail',
			town: 'Juniper Flats',
			stage: 'contacted',
			services: ['pond'],
			budget: 'under-5k',
			createdAt: ago(48),
			firstReplyAt: ago(46),
			assigneeId: sales.id,
			source: 'referral'
		}),
		cora: await makeLead({
			name: 'Cora Dunmore',
			town: 'Linden Ford',
			stage: 'closed',
			closeReason: 'budget',
			services: ['lighting', 'patio'],
			budget: '30k-plus',
			createdAt: ago(24),
			source: 'referral'
		}),
		dev: await makeLead({
			name: 'Dev Ellery',
			town: 'Stillwater Bend',
			message: 'Pondless stream down the slope behind the house',
			budget: 'unsure',
			createdAt: ago(1),
			assigneeId: owner.id
		})
	};
});

const ctxOf = (user: Staff) => ({ userId: user.id });

async function list(search: string, as: Staff = owner) {
	const parsed = parseLeadQuery(new URLSearchParams(search));
	if (!parsed.success) throw new Error(parsed.error.message);
	return listLeads(parsed.data, ctxOf(as));
}
const names = (l: { rows: { name: string }[] }) => l.rows.map((r) => r.name.split(' ')[0]);

function event(path: string, user: Staff | null) {
	const url = new URL(path, 'http://127.0.0.1');
	return {
		url,
		locals: { user: user ? ({ ...user } as SessionUser) : null },
		request: new Request(url)
	} as never;
}

async function status(run: () => Response | Promise<Response>): Promise<number> {
	try {
		return (await run()).status;
	} catch (error) {
		return (error as { status: number }).status;
	}
}

describe('GET /api/leads: sorting', () => {
	it('sorts by received, newest first by default, with total and stage facets', async () => {
		const res = await apiGet(event('/api/leads', owner));
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(names(body)).toEqual(['Dev', 'Cora', 'Ben', 'Ada']);
		expect(body.total).toBe(4);
		expect(body.facets).toMatchObject({ new: 2, contacted: 1, closed: 1, sold: 0 });
	});

	it('sorts by name, town, stage, budget and last touch in both directions', async () => {
		expect(names(await list('sort=name&dir=asc'))).toEqual(['Ada', 'Ben', 'Cora', 'Dev']);
		expect(names(await list('sort=name&dir=desc'))).toEqual(['Dev', 'Cora', 'Ben', 'Ada']);
		expect(names(await list('sort=town&dir=asc'))).toEqual(['Ada', 'Ben', 'Cora', 'Dev']);
		expect(names(await list('sort=stage&dir=asc'))).toEqual(['Ada', 'Dev', 'Ben', 'Cora']);
		expect(names(await list('sort=budget&dir=asc'))).toEqual(['Ben', 'Ada', 'Cora', 'Dev']);
		expect(names(await list('sort=last_touch&dir=asc'))).toEqual(['Ada', 'Ben', 'Cora', 'Dev']);
	});
});

describe('GET /api/leads: filters', () => {
	it('filters by stage (facets keep counting the other stages)', async () => {
		const l = await list('stage=new');
		expect(names(l)).toEqual(['Dev', 'Ada']);
		expect(l.total).toBe(2);
		expect(l.facets.contacted).toBe(1);
		expect(names(await list('stage=new&stage=closed'))).toEqual(['Dev', 'Cora', 'Ada']);
	});

	it('filters by service, budget and assignee (mine, unassigned, a person)', async () => {
		expect(names(await list('service=pond'))).toEqual(['Ben']);
		expect(names(await list('service=patio'))).toEqual(['Cora']);
		expect(names(await list('budget=30k-plus'))).toEqual(['Cora']);
		expect(names(await list('assignee=mine', sales))).toEqual(['Ben']);
		expect(names(await list('assignee=mine', owner))).toEqual(['Dev']);
		expect(names(await list('assignee=unassigned'))).toEqual(['Cora', 'Ada']);
		expect(names(await list(`assignee=${owner.id}`))).toEqual(['Dev']);
	});

	it('filters by awaiting first reply (not replied, not closed or sold)', async () => {
		expect(names(await list('awaiting=1'))).toEqual(['Dev', 'Ada']);
	});

	it('filters received dates as days in the firm time zone', async () => {
		// 23:30 on 9 January in Denver is 06:30 on 10 January in UTC.
		await makeLead({ name: 'Eve Late', createdAt: new Date('2026-01-10T06:30:00Z') });
		expect(names(await list('from=2026-01-09&to=2026-01-09'))).toEqual(['Eve']);
		expect(names(await list('from=2026-01-10&to=2026-01-10'))).toEqual([]);
		expect(names(await list('to=2026-01-09'))).toEqual(['Eve']);
	});
});

describe('GET /api/leads: stage counts kept by triggers', () => {
	// The facets under stage, assignee, budget and "awaiting" come from lead_counts; they must
	// match a plain count of the leads after every kind of write.
	async function exactFacets(where: string) {
		const rows = await client.unsafe(
			`select stage, count(*)::int as n from leads l ${where} group by stage`
		);
		return Object.fromEntries(rows.map((r) => [r.stage, r.n]));
	}
	const nonZero = (f: Record<string, number>) =>
		Object.fromEntries(Object.entries(f).filter(([, n]) => n > 0));

	it('follow stage changes, assignments, first replies, new and deleted leads', async () => {
		await changeStage(owner.id, set.ada.id, { version: set.ada.version, stage: 'visit_booked' });
		await assignLead(owner.id, set.cora.id, { version: set.cora.version, assigneeId: sales.id });
		await logActivity(sales.id, set.dev.id, { kind: 'call', body: 'Left a message' });
		await makeLead({ name: 'Fay Gorse', budget: '30k-plus', assigneeId: sales.id });
		await client`delete from leads where id = ${set.ben.id}`;

		const all = await list('');
		expect(nonZero(all.facets)).toEqual(await exactFacets(''));
		expect(all.facets).toMatchObject({ new: 1, contacted: 1, visit_booked: 1, closed: 1 });
		expect(all.total).toBe(4);

		const mine = await list('assignee=mine&budget=30k-plus', sales);
		expect(names(mine)).toEqual(['Fay', 'Cora']);
		expect(nonZero(mine.facets)).toEqual(
			await exactFacets(`where assignee_id = '${sales.id}' and budget = '30k-plus'`)
		);
		expect((await list('awaiting=1')).facets).toMatchObject({ new: 1, visit_booked: 1 });
		expect((await list('assignee=unassigned&stage=visit_booked')).total).toBe(1);
	});

	it('count exactly under the filters the counters do not hold (service, dates, search)', async () => {
		const l = await list('service=water-feature&stage=new');
		expect(names(l)).toEqual(['Dev', 'Ada']);
		expect(nonZero(l.facets)).toEqual(await exactFacets(`where services && '{water-feature}'`));
		const searched = await list('q=pondless&stage=contacted');
		expect(searched.rows).toEqual([]);
		expect(searched.total).toBe(0);
		expect(searched.facets).toMatchObject({ new: 1, contacted: 0 });
	});

	it('keep the counts of a searched view between its pages and stage chips until a lead changes', async () => {
		for (let i = 0; i < 30; i++) {
			await makeLead({
				message: 'A fountain by the patio',
				services: ['water-feature'],
				createdAt: ago(100 + i)
			});
		}
		const view = 'q=patio&service=water-feature';
		const first = await list(view);
		expect(first.facets).toMatchObject({ new: 31, contacted: 0 });
		expect(first.total).toBe(31);
		const second = await list(`${view}&page=2`);
		expect(second.rows).toHaveLength(6);
		expect(second.facets).toEqual(first.facets);
		expect((await list(`${view}&stage=contacted`)).rows).toEqual([]);

		await changeStage(owner.id, set.ada.id, { version: set.ada.version, stage: 'contacted' });
		const moved = await list(`${view}&stage=contacted`);
		expect(names(moved)).toEqual(['Ada']);
		expect(moved.facets).toMatchObject({ new: 30, contacted: 1 });

		// A change not yet committed is not counted; once committed, it is.
		const [other] =
			await client`select id from leads where stage = 'new' and message like '%fountain%' limit 1`;
		await client.begin(async (tx) => {
			await tx`update leads set stage = 'sold' where id = ${other.id}`;
			expect((await list(`${view}&page=2`)).facets).toMatchObject({ new: 30, sold: 0 });
		});
		const sold = await list(`${view}&page=2`);
		expect(sold.facets).toMatchObject({ new: 29, contacted: 1, sold: 1 });
		expect(sold.total).toBe(31);

		// A renamed contact changes what the words find.
		await client`update contacts set name = 'Ada Patio' where id = ${set.ada.contactId}`;
		await client`update leads set message = 'A boulder' where id = ${set.ada.id}`;
		expect((await list(`${view}&stage=contacted`)).total).toBe(1);
		await client`update contacts set name = 'Ada Brookstone' where id = ${set.ada.contactId}`;
		const gone = await list(`${view}&stage=contacted`);
		expect(gone.rows).toEqual([]);
		expect(gone.facets).toMatchObject({ new: 29, contacted: 0, sold: 1 });
	});

	it('read only the page while the counts of the view are kept', async () => {
		const q = parseLeadQuery(new URLSearchParams('q=patio&service=water-feature&stage=new')).data!;
		const run = (kept: string | null) => {
			const s = listSql(q, ctxOf(owner), false, kept);
			return client.unsafe(s.text, s.params as never[]);
		};
		const cold = await run(null);
		expect(cold[0]._counted).toBe(true);
		expect(cold[0]._facets).toEqual({ new: 1 });
		const warm = await run(cold[0]._snapshot);
		expect(warm[0]._counted).toBe(false);
		expect(warm[0]._facets).toEqual({});
		expect(warm.map((r) => r.id)).toEqual([set.ada.id]);
		await makeLead({ name: 'Eli Fenn', message: 'patio pool', services: ['water-feature'] });
		const after = await run(cold[0]._snapshot);
		expect(after[0]._counted).toBe(true);
		expect(after[0]._facets).toEqual({ new: 2 });
		expect(after.map((r) => r.name)).toEqual(['Eli Fenn', 'Ada Brookstone']);
	});

	it('read the page of a searched view by the numbers picked from its kept matches', async () => {
		const fen = await makeLead({ name: 'Eli Fenn', message: 'patio pool', createdAt: ago(80) });
		const q = parseLeadQuery(new URLSearchParams('q=patio&service=water-feature')).data!;
		const run = (kept: string | null, page?: number[]) => {
			const s = listSql(q, ctxOf(owner), false, kept, { page });
			return client.unsafe(s.text, s.params as never[]);
		};
		const cold = await run(null);
		expect(cold[0]._counted).toBe(true);
		// Every match, newest first: its number times 8 plus its stage (1 is "new", 2 "contacted").
		expect(cold[0]._matches).toEqual([set.ada.number * 8 + 1, fen.number * 8 + 1]);
		expect(cold.map((r) => r.name)).toEqual(['Ada Brookstone', 'Eli Fenn']);
		// While no lead has changed, the page is the leads it is given, found by number.
		const warm = await run(cold[0]._snapshot, [fen.number]);
		expect(warm[0]._counted).toBe(false);
		expect(warm.map((r) => r.name)).toEqual(['Eli Fenn']);
		// After a change, the search runs again and the numbers given are ignored.
		await changeStage(owner.id, set.ada.id, { version: set.ada.version, stage: 'contacted' });
		const after = await run(cold[0]._snapshot, [fen.number]);
		expect(after[0]._counted).toBe(true);
		expect(after.map((r) => r.name)).toEqual(['Ada Brookstone', 'Eli Fenn']);
		expect(after[0]._matches).toEqual([set.ada.number * 8 + 2, fen.number * 8 + 1]);
	});

	it("answer a searched view's first request for a deeper page or a stage chip as a fresh query does, also after a stage change", async () => {
		for (let i = 0; i < 60; i++) {
			await makeLead({
				name: `Fay Number${i}`,
				phone: `(555) 020-${String(1000 + i)}`,
				message: 'A fountain by the patio',
				stage: i % 4 ? 'new' : 'contacted',
				createdAt: ago(100 + (i % 7))
			});
		}
		// What a plain query gives: the matches in the view's stages in the view's order, and the
		// count of every stage.
		const expected = async (match: string, stage: string, offset: number) => {
			const rows = await client.unsafe(
				`select id from leads where ${match} and stage = '${stage}'
				order by created_at desc, number desc limit 25 offset ${offset}`
			);
			const counts = await client.unsafe(
				`select stage, count(*)::int as n from leads where ${match} group by stage`
			);
			return {
				ids: rows.map((r) => r.id),
				facets: Object.fromEntries(counts.map((r) => [r.stage, r.n]))
			};
		};
		// A word (full-text) and a phone fragment (trigram), each asked afresh (no kept facets).
		const views = [
			{ search: 'q=patio', match: `search_text like '%patio%'` },
			{ search: 'q=020-10', match: `search_text like '%020-10%'` }
		];
		const fresh = async (search: string) => {
			const q = parseLeadQuery(new URLSearchParams(search)).data!;
			const s = listSql(q, ctxOf(owner));
			return client.unsafe(s.text, s.params as never[]);
		};
		const check = async () => {
			for (const { search, match } of views) {
				for (const [stage, page] of [
					['new', 2],
					['contacted', 1]
				] as const) {
					const got = await fresh(`${search}&stage=${stage}&page=${page}`);
					const want = await expected(match, stage, (page - 1) * 25);
					expect(got.filter((r) => r.id != null).map((r) => r.id)).toEqual(want.ids);
					expect(got[0]._facets).toEqual(want.facets);
				}
			}
		};
		await check();
		const [lead] = await client`
			select l.id, l.version from leads l join contacts c on c.id = l.contact_id
			where c.name = 'Fay Number1'`;
		await changeStage(owner.id, lead.id, { version: lead.version, stage: 'contacted' });
		await check();
	});

	it('answer a search with more matches than are kept: rows and counts as a fresh query, page after page', async () => {
		const n = KEPT_MATCHES + 30;
		await client`
			insert into contacts (id, name)
			select 'bulk-contact-' || g, 'Bulk Person ' || g from generate_series(1, ${n}) g`;
		await client`
			insert into leads (id, contact_id, stage, services, message, created_at, last_touch_at)
			select 'bulk-lead-' || g, 'bulk-contact-' || g,
				(case when g % 3 = 0 then 'contacted' else 'new' end)::lead_stage, '{water-feature}',
				'A fountain by the lagoon', now() - (g % 97) * interval '1 hour', now()
			from generate_series(1, ${n}) g`;
		const want = async (stage: string, offset: number) =>
			(
				await client.unsafe(
					`select id from leads where search_text like '%lagoon%' and stage = '${stage}'
					order by created_at desc, number desc limit 25 offset ${offset}`
				)
			).map((r) => r.id);
		const q = parseLeadQuery(new URLSearchParams('q=lagoon&stage=contacted&page=3')).data!;
		const s = listSql(q, ctxOf(owner));
		const fresh = await client.unsafe(s.text, s.params as never[]);
		expect(fresh.map((r) => r.id)).toEqual(await want('contacted', 50));
		// Too many to keep: no list of matches, so the next pages search again.
		expect(fresh[0]._matches).toBeNull();
		const contacted = Math.floor(n / 3);
		expect(fresh[0]._facets).toEqual({ new: n - contacted, contacted });
		const next = await list('q=lagoon&stage=new&page=2');
		expect(next.rows.map((r) => r.id)).toEqual(await want('new', 25));
		expect(next.total).toBe(n - contacted);
		const again = await list('q=lagoon&stage=new&page=3');
		expect(again.rows.map((r) => r.id)).toEqual(await want('new', 50));
		expect(again.facets).toEqual(next.facets);
	});

	it('sort by a renamed contact and a moved property at once (sort keys kept by triggers)', async () => {
		await client`update contacts set name = 'Zora Brookstone' where id = ${set.ada.contactId}`;
		await client`update properties set town = 'Yellow Pine' where id = ${set.ada.propertyId}`;
		expect(names(await list('sort=name&dir=asc'))).toEqual(['Ben', 'Cora', 'Dev', 'Zora']);
		expect(names(await list('sort=town&dir=desc'))).toEqual(['Zora', 'Dev', 'Cora', 'Ben']);
	});
});

describe('GET /api/leads: search', () => {
	it('finds leads by name, e-mail, phone, town and message, all words required', async () => {
		expect(names(await list('q=brookstone'))).toEqual(['Ada']);
		expect(names(await list('q=ADA.BROOK@'))).toEqual(['Ada']);
		expect(names(await list('q=010-2222'))).toEqual(['Ada']);
		expect(names(await list('q=5550102222'))).toEqual(['Ada']);
		expect(names(await list('q=juniper'))).toEqual(['Ben']);
		expect(names(await list('q=pondless slope'))).toEqual(['Dev']);
		expect(names(await list('q=pondless patio'))).toEqual([]);
		expect(names(await list('q=50%25'))).toEqual([]);
	});

	it('follows edits of the contact and the property (kept by triggers)', async () => {
		await client`update contacts set name = 'Ada Quarrystone' where id = ${set.ada.contactId}`;
		await client`update properties set town = 'Fernhollow' where id = ${set.ada.propertyId}`;
		expect(names(await list('q=quarrystone fernhollow'))).toEqual(['Ada']);
		expect(names(await list('q=brookstone'))).toEqual([]);
	});

	it('finds words with accents, apostrophes and hyphens, and by the start of a word', async () => {
		await makeLead({
			name: 'Zoë Ångström-Lefèvre',
			email: 'zoe@test.example',
			town: 'Saint-Étienne-du-Lac',
			message: "A rill past the neighbours' old well",
			services: ['pond']
		});
		await makeLead({ name: "Siobhán O'Rourke", email: 'siobhan@test.example' });
		expect(names(await list('q=zoe'))).toEqual(['Zoë']);
		expect(names(await list('q=ZOË'))).toEqual(['Zoë']);
		expect(names(await list('q=angstrom-lefevre'))).toEqual(['Zoë']);
		expect(names(await list('q=lefèvre'))).toEqual(['Zoë']);
		expect(names(await list('q=saint-etienne'))).toEqual(['Zoë']);
		expect(names(await list("q=neighbours' well"))).toEqual(['Zoë']);
		expect(names(await list("q=o'rourke"))).toEqual(['Siobhán']);
		expect(names(await list('q=o’rourke siobhan'))).toEqual(['Siobhán']);
		expect(names(await list("q=o'brien"))).toEqual([]);
		expect(names(await list('q=brook'))).toEqual(['Ada']);
		expect(names(await list('q=lefèvre&service=pond'))).toEqual(['Zoë']);
		expect(names(await list('q=lefèvre&service=patio&service=lighting'))).toEqual([]);
		expect(names(await list('q=brookstone&service=pond&service=water-feature'))).toEqual(['Ada']);
	});

	it('finds a word by its start when edits bring new words, and when many words share the start', async () => {
		await makeLead({ name: 'Gil Quarryman' });
		expect(names(await list('q=quarry'))).toEqual(['Gil']);
		await client`update contacts set name = 'Ada Quarrystone' where id = ${set.ada.contactId}`;
		expect(names(await list('q=quarry'))).toEqual(['Gil', 'Ada']);
		await client`update leads set message = 'A quarrying question' where id = ${set.ben.id}`;
		expect(names(await list('q=quarry'))).toEqual(['Gil', 'Ben', 'Ada']);
		const letter = (i: number) => String.fromCharCode(97 + i);
		for (let i = 0; i < 40; i++) {
			await makeLead({ message: `A zz${letter(i % 26)}${letter(Math.floor(i / 26))} pond` });
		}
		expect((await list('q=zz')).total).toBe(40);
		expect((await list('q=zzb pond')).total).toBe(2);
	});

	it('finds a word that is only part of an e-mail address, such as its mail domain', async () => {
		await makeLead({ name: 'Hal Ostrander', email: 'hal.o@quarrymail.example' });
		expect(names(await list('q=quarrymail'))).toEqual(['Hal']);
		expect(names(await list('q=ostrander quarrymail'))).toEqual(['Hal']);
		// A word that begins a word of some lead is still matched only that way.
		expect(names(await list('q=brook'))).toEqual(['Ada']);
		expect(names(await list('q=quarrymail patio'))).toEqual([]);
	});

	it('pages a searched view and its stage chips in the same order as a fresh search', async () => {
		for (let i = 0; i < 30; i++) {
			await makeLead({
				message: 'A fountain by the patio',
				stage: i % 3 ? 'new' : 'contacted',
				createdAt: ago(100 + i)
			});
		}
		const ids = async (where: string, order = 'created_at desc, number desc') =>
			(
				await client.unsafe(
					`select id from leads where search_text like '%patio%' ${where} order by ${order}`
				)
			).map((r) => r.id);
		expect((await list('q=patio')).total).toBe(31);
		// The next requests of the view read their pages from the matches the first one kept.
		const page2 = await list('q=patio&page=2');
		expect(page2.rows.map((r) => r.id)).toEqual((await ids('')).slice(25));
		const contacted = await list('q=patio&stage=contacted');
		expect(contacted.rows.map((r) => r.id)).toEqual(await ids(`and stage = 'contacted'`));
		expect(contacted.total).toBe(10);
		const byName = await list('q=patio&sort=name&dir=asc&stage=new');
		await list('q=patio&sort=name&dir=asc&stage=new&page=2');
		expect(byName.rows.map((r) => r.id)).toEqual(
			(await ids(`and stage = 'new'`, 'sort_name, number')).slice(0, 21)
		);
	});

	it('answers words from the full-text index and fragments from the trigram index', async () => {
		const plan = async (search: string) => {
			const q = parseLeadQuery(new URLSearchParams(search));
			const s = listSql(q.data!, ctxOf(owner));
			const rows = await client.begin(async (tx) => {
				await tx`set local enable_seqscan = off`;
				return tx.unsafe(`explain ${s.text}`, s.params as never[]);
			});
			return rows.map((r) => r['QUERY PLAN']).join('\n');
		};
		expect(await plan('q=brookstone')).toContain('leads_search_words_idx');
		expect(await plan('q=ada.brook@')).toContain('leads_search_trgm_idx');
		expect(await plan('q=010-2222')).toContain('leads_search_trgm_idx');
	});
});

describe('GET /api/leads: paging', () => {
	it('pages with the right total', async () => {
		for (let i = 0; i < 30; i++) await makeLead({ createdAt: ago(100 + i) });
		const first = await list('size=25');
		const second = await list('size=25&page=2');
		expect(first.total).toBe(34);
		expect(first.rows).toHaveLength(25);
		expect(second.rows).toHaveLength(9);
		expect(second.total).toBe(34);
		const ids = new Set([...first.rows, ...second.rows].map((r) => r.id));
		expect(ids.size).toBe(34);
		expect((await list('size=25&page=3')).rows).toHaveLength(0);
	});

	it('pages on from where the page before ended, and by position again once a lead changes', async () => {
		for (let i = 0; i < 30; i++) await makeLead({ createdAt: ago(100 + i) });
		const first = await list('size=25');
		const second = await list('size=25&page=2');
		expect(second.rows.map((r) => r.id)).toEqual(
			(await client`select id from leads order by created_at desc, number desc offset 25`).map(
				(r) => r.id
			)
		);
		// A new lead comes first: every later page begins one lead earlier.
		await makeLead({ name: 'Gus Heath' });
		const shifted = await list('size=25&page=2');
		expect(shifted.rows[0].id).toBe(first.rows[24].id);
		expect(shifted.rows.map((r) => r.id).slice(1)).toEqual(second.rows.map((r) => r.id));
		expect(names(await list('size=25'))[0]).toBe('Gus');
		// The same again by name, ascending, through a renamed contact.
		const byName = await list('sort=name&dir=asc&size=25&page=2');
		await client`update contacts set name = 'Zoe Zephyr' where id = ${set.dev.contactId}`;
		const renamed = await list('sort=name&dir=asc&size=25&page=2');
		expect(renamed.rows.map((r) => r.id)).toEqual(
			(await client`select id from leads order by sort_name, number offset 25 limit 25`).map(
				(r) => r.id
			)
		);
		expect(renamed.rows).not.toEqual(byName.rows);
		expect(names(renamed).at(-1)).toBe('Zoe');
	});

	it('reads a deep page from the start an earlier answer found while no lead has changed', async () => {
		for (let i = 0; i < 30; i++) await makeLead({ createdAt: ago(100 + i) });
		const q = parseLeadQuery(new URLSearchParams('size=25&page=2')).data!;
		const answer = (start: PageStart | null) => {
			const s = listSql(q, ctxOf(owner), false, null, { start });
			return client.unsafe(s.text, s.params as never[]);
		};
		const run = async (start: PageStart | null) =>
			(await answer(start)).filter((r) => r.id != null);
		const byOffset = await run(null);
		expect(byOffset).toHaveLength(9);
		// A start one row into the page is followed as given: the page was sought, not skipped to.
		const start = {
			snapshot: (await client`select pg_current_snapshot()::text as s`)[0].s as string,
			key: byOffset[1]._key as string,
			number: byOffset[1].number as number,
			inclusive: true
		};
		const sought = await run(start);
		expect(sought.map((r) => r.id)).toEqual(byOffset.slice(1).map((r) => r.id));
		expect(await run({ ...start, inclusive: false })).toHaveLength(7);
		expect((await answer(start))[0]._sought).toBe(true);
		// Once a lead has changed, the start is not trusted: no rows, and the caller is told so.
		await changeStage(owner.id, set.dev.id, { version: set.dev.version, stage: 'contacted' });
		const stale = await answer(start);
		expect(stale[0]._sought).toBe(false);
		expect(stale.filter((r) => r.id != null)).toEqual([]);
	});
});

describe('GET /api/leads: bad parameters and roles', () => {
	it.each([
		['sort=colour', 'sort'],
		['dir=up', 'dir'],
		['page=0', 'page'],
		['page=two', 'page'],
		['size=7', 'size'],
		['stage=won', 'stage'],
		['from=2027-13-45', 'from'],
		['from=2027-03-10&to=2027-03-01', 'to'],
		['awaiting=maybe', 'awaiting'],
		['colour=blue', 'colour'],
		[`q=${'x'.repeat(101)}`, 'q']
	])('answers 400 for %s, naming the parameter', async (search, param) => {
		const res = await apiGet(event(`/api/leads?${search}`, owner));
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error).toContain(param);
	});

	it('refuses crew (403) and anonymous visitors (401); the CSV export too', async () => {
		expect(await status(() => apiGet(event('/api/leads', crew)))).toBe(403);
		expect(await status(() => apiGet(event('/api/leads', null)))).toBe(401);
		expect(await status(() => csvGet(event('/office/leads/export.csv', crew)))).toBe(403);
		expect(await status(() => apiGet(event('/api/leads', sales)))).toBe(200);
	});
});

describe('edits', () => {
	it('refuses the second of two edits from the same version, naming who changed it and when', async () => {
		const version = set.ada.version;
		await changeStage(sales.id, set.ada.id, { version, stage: 'contacted' });
		const second = assignLead(owner.id, set.ada.id, { version, assigneeId: owner.id });
		await expect(second).rejects.toBeInstanceOf(LeadConflictError);
		await expect(second).rejects.toThrow(/^Changed by Test sales at .+ reload/);
		const [after] = await db.select().from(leads).where(eq(leads.id, set.ada.id));
		expect(after).toMatchObject({ stage: 'contacted', assigneeId: null, version: version + 1 });
	});

	it('closing records the reason on the lead and the timeline', async () => {
		await expect(
			changeStage(owner.id, set.dev.id, { version: set.dev.version, stage: 'closed' })
		).rejects.toThrow(/reason/);
		await changeStage(owner.id, set.dev.id, {
			version: set.dev.version,
			stage: 'closed',
			closeReason: 'chose_another_firm',
			closeNote: 'Went with a pool builder'
		});
		const [after] = await db.select().from(leads).where(eq(leads.id, set.dev.id));
		expect(after.closeReason).toBe('chose_another_firm');
		const entries = await db.select().from(activities).where(eq(activities.leadId, set.dev.id));
		expect(entries.find((e) => e.kind === 'stage')).toMatchObject({
			actorId: owner.id,
			data: { from: 'new', to: 'closed', reason: 'chose_another_firm' }
		});
	});

	it('the first logged call sets the first-reply time and moves a new lead to contacted', async () => {
		await logActivity(sales.id, set.ada.id, { kind: 'note', body: 'Wants it before June' });
		let [after] = await db.select().from(leads).where(eq(leads.id, set.ada.id));
		expect(after.firstReplyAt).toBeNull();
		await logActivity(sales.id, set.ada.id, { kind: 'call', body: 'Talked; sending times' });
		[after] = await db.select().from(leads).where(eq(leads.id, set.ada.id));
		expect(after.firstReplyAt).not.toBeNull();
		expect(after.stage).toBe('contacted');
		const firstReply = after.firstReplyAt!.getTime();
		await logActivity(sales.id, set.ada.id, { kind: 'call', body: 'Second call' });
		[after] = await db.select().from(leads).where(eq(leads.id, set.ada.id));
		expect(after.firstReplyAt!.getTime()).toBe(firstReply);
	});

	it('sends an edited template e-mail once per send key, on the timeline, as first reply', async () => {
		await clearMail();
		const input = {
			template: 'visit',
			sendKey: 'send-key-0001',
			subject: 'A site visit for your boulder',
			body: 'Hello Ada,\n\nTuesday at 10?'
		};
		expect(await sendLeadMail(sales, set.ada.id, input)).toEqual({ queued: true });
		expect(await sendLeadMail(sales, set.ada.id, input)).toEqual({ queued: false });
		const mails = await db.select().from(outbox).where(eq(outbox.leadId, set.ada.id));
		expect(mails).toHaveLength(1);
		await deliverOutboxMessage(mails[0].id);
		const mail = await waitForMail('ada.brook@test.example', /site visit for your boulder/);
		expect(mail.text).toContain('Tuesday at 10?');
		const entries = await db.select().from(activities).where(eq(activities.leadId, set.ada.id));
		expect(entries.filter((e) => e.kind === 'email')).toHaveLength(1);
		const [after] = await db.select().from(leads).where(eq(leads.id, set.ada.id));
		expect(after.firstReplyAt).not.toBeNull();
	});
});

describe('CSV export', () => {
	it('exports the filtered view with RFC 4180 quoting and formulas neutralised', async () => {
		await makeLead({
			name: '=HYPERLINK("http://evil.example","Ada")',
			town: 'Lake, "North"',
			phone: '+1 555 010 9999',
			createdAt: ago(2)
		});
		const res = await csvGet(event('/office/leads/export.csv?stage=new&sort=name&dir=asc', owner));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('text/csv');
		const text = await res.text();
		const lines = text.split('\r\n');
		expect(lines[0]).toMatch(/^Number,Received,Name,E-mail,Phone,Town/);
		expect(lines).toHaveLength(5); // header, three new leads, and the empty string after the last CRLF
		expect(text).toContain('"\'=HYPERLINK(""http://evil.example"",""Ada"")"');
		expect(text).toContain(`'+1 555 010 9999`);
		expect(text).toContain('"Lake, ""North"""');
		expect(text).not.toContain('Cora');
	});
});

describe('Today', () => {
	it('lists new leads awaiting a reply oldest first, counts stages and sources, median reply', async () => {
		const today = await todaySummary();
		expect(today.awaiting.map((a) => a.name)).toEqual(['Ada Brookstone', 'Dev Ellery']);
		expect(today.stages).toMatchObject({ new: 2, contacted: 1, closed: 1 });
		expect(today.sources).toEqual([
			{ source: 'referral', leads: 2, sold: 0, share: 0 },
			{ source: 'website', leads: 2, sold: 0, share: 0 }
		]);
		expect(today.medianReplyMs).toBeCloseTo(2 * HOUR, -3);
		await makeLead({
			stage: 'sold',
			source: 'referral',
			createdAt: ago(30),
			firstReplyAt: ago(26)
		});
		const later = await todaySummary();
		expect(later.sources[0]).toMatchObject({ source: 'referral', leads: 3, sold: 1 });
		expect(later.sources[0].share).toBeCloseTo(1 / 3);
		expect(later.medianReplyMs).toBeCloseTo(3 * HOUR, -3);
	});
});
