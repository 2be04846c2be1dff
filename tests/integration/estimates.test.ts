import { eq } from 'drizzle-orm';
import { fountainIn } from '../support/fountain';
import { isHttpError } from '@sveltejs/kit';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import {
	activities,
	estimateAcceptances,
	estimates,
	leads,
	outbox,
	photos,
	priceListItems,
	siteVisits
} from '$lib/server/platform/db/schema';
import { formatCents } from '$lib/money';
import { acceptEstimate, homeownerMessage, openByToken } from '$lib/server/estimates/homeowner';
import { createEstimate, newVersion, saveEstimate } from '$lib/server/estimates/versions';
import { getEstimate, type StoredResult } from '$lib/server/estimates/records';
import { sendEstimate } from '$lib/server/estimates/sending';
import { exportCsv, importCsv, loadCatalog } from '$lib/server/pricelist/catalog';
import { previewCsv } from '$lib/server/pricelist/csv';
import { estimate as runEngine, type ParsedDesign } from '$lib/estimating';
import type { YardPhoto } from '$lib/server/photos/estimate-photos';
import { load as homeownerLoad } from '../../src/routes/(homeowner)/estimate/[token]/+page.server';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { makeLead, seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

async function salesAndLead() {
	const sales = await makeUser('sales');
	await makeUser('owner');
	const lead = await makeLead(sales.id);
	return { sales, lead };
}

async function draft() {
	const { sales, lead } = await salesAndLead();
	const id = (await createEstimate(lead.id, sales))!;
	return { sales, lead, id, row: (await getEstimate(id))! };
}

const HEADER = 'sku,name,category,unit,unit_cost,unit_price,taxable,tags';

describe('price list CSV', () => {
	it('previews good rows and writes them only when every row is good', async () => {
		const csv = `${HEADER}\nNEW-1,"Flagstone, buff",stone,ton,210.00,395.50,yes,stone;flag\nPIPE-S40-075,3/4 in pipe,pipe,ft,0.50,1.10,yes,\n`;
		const preview = previewCsv(csv);
		expect(preview.ok).toBe(true);
		expect(preview.rows.map((r) => r.item?.unitPriceCents)).toEqual([39550, 110]);
		const result = await importCsv(csv);
		expect(result.written).toBe(2);
		const [row] = await db.select().from(priceListItems).where(eq(priceListItems.sku, 'NEW-1'));
		expect(row).toMatchObject({
			name: 'Flagstone, buff',
			unitCostCents: 21000,
			tags: ['stone', 'flag']
		});
		// The existing pipe item keeps its engine attributes? No: a CSV row replaces the item whole.
		const catalog = await loadCatalog();
		expect(catalog.items!.find((i) => i.sku === 'PIPE-S40-075')?.unitPrice).toBe(110);
	});

	it('reports each bad row with its line number and writes nothing', async () => {
		const before = await db.select().from(priceListItems);
		const csv = `${HEADER}\nOK-1,Good,other,each,1.00,2.00,yes,\nBAD-1,Neg,other,each,-1.00,2.00,yes,\nBAD-2,Unit,other,furlong,1.00,2.00,yes,\nOK-1,Dup,other,each,1.00,2.00,maybe,\n`;
		const result = await importCsv(csv);
		expect(result.written).toBe(0);
		const errs = result.preview.rows.map((r) => [r.line, r.errors.length > 0]);
		expect(errs).toEqual([
			[2, false],
			[3, true],
			[4, true],
			[5, true]
		]);
		expect(result.preview.rows[2].errors.join(' ')).toMatch(/unit “furlong”/);
		expect(result.preview.rows[3].errors.join(' ')).toMatch(/also appears on line 2/);
		expect(await db.select().from(priceListItems)).toHaveLength(before.length);
	});

	it('exports what it imports', async () => {
		const csv = await exportCsv();
		const preview = previewCsv(csv);
		expect(preview.ok).toBe(true);
		const items = await db.select().from(priceListItems);
		expect(preview.rows).toHaveLength(items.length);
		const pipe = preview.rows.find((r) => r.sku === 'PIPE-S40-075')!.item!;
		expect(pipe.attributes).toEqual({ pipe: { material: 'pvc-sch40', size: '3/4' } });
	});
});

describe('starting from the visit notes', () => {
	it('sizes the basin and the cable run from the latest notes and writes their words as scope', async () => {
		const { sales, lead } = await salesAndLead();
		const start = new Date(Date.now() - 86400000);
		const end = new Date(start.getTime() + 3600000);
		await db.insert(siteVisits).values({
			id: 'visit-1',
			leadId: lead.id,
			salespersonId: sales.id,
			status: 'booked',
			startsAt: start,
			endsAt: end,
			bufferMinutes: 30,
			blocked: `[${start.toISOString()},${end.toISOString()})`,
			timeZone: 'America/Denver',
			tokenHash: 'x'.repeat(64),
			tokenExpiresAt: end,
			notes: {
				spotLengthFt: 9,
				spotWidthFt: 7,
				depthAvailableIn: 18,
				toHouseFt: 40,
				notes: 'Gate is 34 in wide',
				powerLocation: 'GFCI by the back door'
			},
			notesUpdatedAt: end
		} as typeof siteVisits.$inferInsert);
		const id = (await createEstimate(lead.id, sales))!;
		const row = (await getEstimate(id))!;
		const design = row.design as {
			features: { kind: string; basin: { size: { lengthFt: number } } }[];
			lighting: { runs: { fixtures: { distanceFt: number }[] }[] };
		};
		expect(fountainIn(design).basin?.size).toMatchObject({ lengthFt: 7, widthFt: 5, depthFt: 1.5 });
		expect(design.lighting.runs[0].fixtures[0].distanceFt).toBe(40);
		expect(row.scope).toBe('Gate is 34 in wide\nPower: GFCI by the back door');
		expect(row.result).not.toBeNull();
	});
});

describe('saving an estimate', () => {
	it('stores the design, the engine result and the totals, and bumps the revision', async () => {
		const { sales, row, lead } = await draft();
		expect(row.number).toBe(1);
		expect(row.totalCents).toBeGreaterThan(0);
		const [l] = await db.select().from(leads).where(eq(leads.id, lead.id));
		expect(l.stage).toBe('estimating');
		const design = { ...row.design, options: [{ id: 'low-wall', name: 'Wall', selected: true }] };
		const out = await saveEstimate(
			row.id,
			{ revision: 1, design, overrides: [], scope: 'x' },
			sales
		);
		expect(out.kind).toBe('saved');
		const saved = (await getEstimate(row.id))!;
		expect(saved.revision).toBe(2);
		const engine = runEngine(design, await loadCatalog());
		expect(engine.ok && engine.pricing.totalCents).toBe(saved.totalCents);
	});

	it('answers a conflict naming who saved first', async () => {
		const { sales, row } = await draft();
		const owner = {
			id: (await db.query.users.findFirst({ where: (u, { eq }) => eq(u.role, 'owner') }))!.id,
			email: '',
			name: 'Test owner',
			role: 'owner' as const
		};
		expect(
			(
				await saveEstimate(
					row.id,
					{ revision: 1, design: row.design, overrides: [], scope: '' },
					owner
				)
			).kind
		).toBe('saved');
		const late = await saveEstimate(
			row.id,
			{ revision: 1, design: row.design, overrides: [], scope: '' },
			sales
		);
		expect(late).toMatchObject({ kind: 'conflict', revision: 2, by: 'Test owner' });
	});

	it('keeps an invalid design but no result, with field errors', async () => {
		const { sales, row } = await draft();
		const design = {
			...row.design,
			outlets: [{ id: 'o', name: 'x', kind: 'bubbler', bubbleHeightIn: -1, boreIn: 1 }]
		};
		const out = await saveEstimate(
			row.id,
			{ revision: 1, design, overrides: [], scope: '' },
			sales
		);
		expect(out.kind === 'saved' && out.errors[0].path).toMatch(
			/design\.features\.0\.outlets\.0\.bubbleHeightIn/
		);
		expect((await getEstimate(row.id))!.result).toBeNull();
		expect((await sendEstimate(row.id, sales)).kind).toBe('invalid');
	});
});

describe('sending, tokens and the freeze', () => {
	it('sends a hashed, expiring link; the draft is then read-only; a new version is v2', async () => {
		const { sales, row, lead } = await draft();
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		const stored = (await getEstimate(row.id))!;
		expect(stored.status).toBe('sent');
		expect(stored.tokenHash).not.toContain(sent.token);
		expect(stored.tokenHash).toHaveLength(64);
		const days = (stored.expiresAt!.getTime() - Date.now()) / 86400000;
		expect(days).toBeGreaterThan(29.9);
		expect(days).toBeLessThan(30.1);
		expect((await openByToken(sent.token)).kind).toBe('open');
		expect(
			(
				await saveEstimate(
					row.id,
					{ revision: stored.revision, design: row.design, overrides: [], scope: '' },
					sales
				)
			).kind
		).toBe('frozen');
		const [l] = await db.select().from(leads).where(eq(leads.id, lead.id));
		expect(l.stage).toBe('estimate_sent');
		const timeline = await db.select().from(activities).where(eq(activities.leadId, lead.id));
		expect(timeline.map((a) => a.kind)).toContain('estimate.sent');
		const v2 = (await newVersion(row.id, sales))!;
		expect((await getEstimate(v2))!).toMatchObject({ number: 2, status: 'draft' });
	});

	it('treats wrong, expired and superseded links alike', async () => {
		const { sales, row } = await draft();
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		expect((await openByToken('not-a-real-token-at-all-xyz')).kind).toBe('unavailable');
		expect((await openByToken('../../etc')).kind).toBe('unavailable');
		await db
			.update(estimates)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.where(eq(estimates.id, row.id));
		expect((await openByToken(sent.token)).kind).toBe('unavailable');
		const renewed = await sendEstimate(row.id, sales);
		if (renewed.kind !== 'sent') throw new Error(renewed.kind);
		expect((await openByToken(renewed.token)).kind).toBe('open');
		expect((await openByToken(sent.token)).kind).toBe('unavailable');
		const v2 = (await newVersion(row.id, sales))!;
		const sent2 = await sendEstimate(v2, sales);
		if (sent2.kind !== 'sent') throw new Error(sent2.kind);
		expect((await openByToken(renewed.token)).kind).toBe('unavailable');
		expect(
			(
				await acceptEstimate(
					renewed.token,
					{ fullName: 'Ada Fernhill', options: [], alternates: {} },
					{ ip: null, userAgent: null }
				)
			).kind
		).toBe('unavailable');
	});
});

describe('the builder buttons', () => {
	it('send and new version act only on a version of the lead in the address', async () => {
		const { actions } = await import('../../src/routes/office/leads/[id]/estimate/+page.server');
		const { sales, row } = await draft();
		const other = await makeLead(sales.id, 'neighbour@test.example');
		const post = async (action: 'send' | 'newVersion', leadId: string, estimateId: string) => {
			const body = new FormData();
			body.set('estimateId', estimateId);
			const url = `http://127.0.0.1/office/leads/${leadId}/estimate?/${action}`;
			return (await actions[action]({
				params: { id: leadId },
				locals: { user: sales },
				url: new URL(url),
				request: new Request(url, { method: 'POST', body })
			} as never)) as { status?: number; data?: { message?: string }; sent?: boolean };
		};
		for (const action of ['send', 'newVersion'] as const) {
			const refused = await post(action, other.id, row.id);
			expect(refused.status).toBe(404);
			expect(refused.data?.message).toMatch(/not a version of this lead/);
		}
		expect((await post('send', other.id, '')).status).toBe(404);
		expect((await getEstimate(row.id))!.status).toBe('draft');
		expect(await post('send', row.leadId, row.id)).toMatchObject({ sent: true });
	});
});

describe("the homeowner's page", () => {
	const open = (token: string) =>
		homeownerLoad({ params: { token }, setHeaders: () => {} } as never) as Promise<{
			view: unknown;
		}>;
	const statusOf = (token: string) =>
		open(token).then(
			() => 200,
			(e: unknown) => (isHttpError(e) ? e.status : 500)
		);

	it('answers 404 for wrong, expired and replaced links, with the same message', async () => {
		const { sales, row } = await draft();
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		expect(await statusOf(sent.token)).toBe(200);
		const renewed = await sendEstimate(row.id, sales);
		if (renewed.kind !== 'sent') throw new Error(renewed.kind);
		const messages: string[] = [];
		for (const token of ['not-a-real-token-at-all-xyz', sent.token]) {
			const e = await open(token).catch((x: unknown) => x);
			expect(isHttpError(e) && e.status).toBe(404);
			messages.push(isHttpError(e) ? e.body.message : '');
		}
		await db
			.update(estimates)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.where(eq(estimates.id, row.id));
		expect(await statusOf(renewed.token)).toBe(404);
		expect(new Set(messages).size).toBe(1);
		expect(messages[0]).not.toMatch(/R-\d|v\d/);
	});

	it('shows the intake photos of the lead through short-lived signed links, and the design', async () => {
		const { sales, row, lead } = await draft();
		const photo = (id: string, context: string) => ({
			id,
			leadId: lead.id,
			context,
			displayKey: `intake/${id}/display.webp`,
			thumbKey: `intake/${id}/thumb.webp`,
			width: 2048,
			height: 1536,
			bytes: 1000
		});
		await db.insert(photos).values([photo('yard-1', 'intake'), photo('visit-1', 'visit')]);
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		const data = await open(sent.token);
		const view = data.view as { kind: string; photos: YardPhoto[]; design: ParsedDesign | null };
		expect(view.kind).toBe('open');
		expect(view.photos.map((p) => p.id)).toEqual(['yard-1']);
		const thumb = new URL(view.photos[0].thumbUrl);
		expect(thumb.pathname).toContain('intake/yard-1/thumb.webp');
		expect(thumb.searchParams.get('X-Amz-Expires')).toBe('600');
		expect(view.photos[0].fullUrl).toContain('intake/yard-1/display.webp');
		expect(view.design && fountainIn(view.design).basin?.size).toMatchObject({
			shape: 'rectangle'
		});
		// The homeowner reads the safety notes that concern them, ending with the local-codes one.
		const cautions = (data.view as { cautions: { id: string }[] }).cautions.map((c) => c.id);
		expect(cautions).toEqual(expect.arrayContaining(['locate-utilities', 'licensed-electrician']));
		expect(cautions.at(-1)).toBe('local-codes');
		expect(cautions).not.toContain('heavy-lifting');
	});
});

describe('acceptance', () => {
	it('records one acceptance under concurrent accepts, marks the lead sold and freezes it', async () => {
		const { sales, row, lead } = await draft();
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		const input = {
			fullName: 'Ada Fernhill',
			options: ['low-wall'],
			alternates: { topping: 'topping-slate' }
		};
		const meta = { ip: '203.0.113.9', userAgent: 'TestPhone/1.0' };
		const results = await Promise.all(
			Array.from({ length: 6 }, () => acceptEstimate(sent.token, input, meta))
		);
		expect(results.every((r) => r.kind === 'accepted')).toBe(true);
		expect(results.filter((r) => r.kind === 'accepted' && r.first)).toHaveLength(1);
		const rows = await db.select().from(estimateAcceptances);
		expect(rows).toHaveLength(1);
		const stored = (await getEstimate(row.id))!;
		const result = stored.result as unknown as StoredResult;
		// The figure the homeowner agreed to, added up here from the stored parts rather than by
		// the acceptance code: the base, the low wall taken, and slate chosen over pebbles.
		const pricing = result.priced.pricing;
		const wall = pricing.options.find((o) => o.id === 'low-wall')!;
		const slate = pricing.alternates
			.find((a) => a.id === 'topping')!
			.choices.find((c) => c.id === 'topping-slate')!;
		expect(wall.selected).toBe(false);
		const totalCents = pricing.base.totalCents + wall.totals.totalCents + slate.totals.totalCents;
		expect(totalCents).toBeGreaterThan(stored.totalCents); // the wall costs extra
		const expected = { totalCents, depositCents: Math.round(totalCents * 0.3) };
		expect(rows[0]).toMatchObject({
			typedName: 'Ada Fernhill',
			ipAddress: '203.0.113.9',
			userAgent: 'TestPhone/1.0',
			estimateNumber: 1,
			revision: stored.revision,
			totalCents: expected.totalCents,
			depositCents: expected.depositCents,
			optionsChosen: { options: ['low-wall'], alternates: { topping: 'topping-slate' } }
		});
		expect(stored.status).toBe('accepted');
		const [l] = await db.select().from(leads).where(eq(leads.id, lead.id));
		expect(l.stage).toBe('sold');
		expect(
			(
				await saveEstimate(
					row.id,
					{ revision: stored.revision, design: row.design, overrides: [], scope: '' },
					sales
				)
			).kind
		).toBe('frozen');
		expect((await sendEstimate(row.id, sales)).kind).toBe('invalid');
		expect((await openByToken(sent.token)).kind).toBe('accepted');
		// The mails carry the same figures, to the cent.
		const mails = await db.select().from(outbox);
		const accepted = mails.filter((m) => m.dedupeKey.startsWith('estimate-accepted:'));
		expect(accepted.map((m) => m.to).sort()).toEqual([
			'homeowner@test.example',
			'owner@test.example',
			'sales@test.example'
		]);
		for (const m of accepted) {
			expect(m.text).toContain(`Total: ${formatCents(expected.totalCents)}`);
			expect(m.text).toContain(`Deposit: ${formatCents(expected.depositCents)}`);
		}
		const sentMail = mails.find((m) => m.dedupeKey.startsWith('estimate-sent:'))!;
		expect(sentMail.text).toContain(formatCents(stored.totalCents));
		expect(sentMail.text).toContain(formatCents(stored.depositCents));
		expect(sentMail.text).toContain(`/estimate/${sent.token}`);
	});

	it('takes a decline with its reason and a question onto the timeline and to the salesperson', async () => {
		const { sales, row, lead } = await draft();
		const sent = await sendEstimate(row.id, sales);
		if (sent.kind !== 'sent') throw new Error(sent.kind);
		expect(await homeownerMessage(sent.token, 'question', 'Can the wall be lower?')).toBe(true);
		expect(await homeownerMessage(sent.token, 'decline', 'Over our budget this year')).toBe(true);
		expect(await homeownerMessage(sent.token, 'decline', 'again')).toBe(false);
		const timeline = await db.select().from(activities).where(eq(activities.leadId, lead.id));
		expect(timeline.filter((a) => a.kind.startsWith('estimate.')).map((a) => a.kind)).toEqual(
			expect.arrayContaining(['estimate.question', 'estimate.declined'])
		);
		const mails = await db.select().from(outbox);
		expect(mails.filter((m) => m.to === 'sales@test.example').map((m) => m.subject)).toEqual(
			expect.arrayContaining([
				expect.stringMatching(/^Question from/),
				expect.stringMatching(/^Declined/)
			])
		);
		expect((await getEstimate(row.id))!.status).toBe('declined');
		expect((await openByToken(sent.token)).kind).toBe('declined');
	});
});
