// The price-list CSV import and export for all three lists (items, pumps, labor) against the real
// database: good files are written whole, a file with any bad row writes nothing, an export
// imports back unchanged, and only the owner can import (sales may export).
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import {
	estimatingSettings,
	laborRates,
	priceListItems,
	pumpModels,
	siteVisits
} from '$lib/server/platform/db/schema';
import { estimate as runEngine } from '$lib/estimating';
import { demoDesign } from '../../scripts/seed/demo-catalog';
import { exportPriceList, importPriceList, loadCatalog } from '$lib/server/pricelist/catalog';
import { createEstimate } from '$lib/server/estimates/versions';
import { getEstimate } from '$lib/server/estimates/records';
import { actions } from '../../src/routes/office/price-list/import/+page.server';
import { actions as pageActions } from '../../src/routes/office/price-list/+page.server';
import { LABOR_TASKS, taskHours } from '$lib/server/pricelist/csv';
import { GET as exportRoute } from '../../src/routes/office/price-list/export/+server';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { makeLead, seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

const PUMPS = 'pump_id,name,watts,price,cost,curve_gph_ft';
const LABOR = 'kind,labor_id,name,unit,hours,cost_per_hour,price_per_hour,default_rate';

async function snapshot() {
	const [items, pumps, rates, settings] = await Promise.all([
		db.select().from(priceListItems).orderBy(priceListItems.sku),
		db.select().from(pumpModels).orderBy(pumpModels.id),
		db.select().from(laborRates).orderBy(laborRates.id),
		db.select().from(estimatingSettings)
	]);
	return { items, pumps, rates, settings };
}

function laborHoursFor(catalog: unknown, task: RegExp) {
	const result = runEngine(demoDesign(), catalog);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result.labor.tasks.find((t) => task.test(t.task))?.hours;
}

describe('pump models', () => {
	it('writes new and changed pumps with their curves, and the engine can choose them', async () => {
		const csv = [
			PUMPS,
			'pump-q700,"Quiet pump Q-700, 3 m cord",60,199.00,,0:9;350:7;700:0',
			'pump-s900,Submersible pump S-900,90,250.50,131.00,0:12.5;600:8;1100:0'
		].join('\r\n');
		const result = await importPriceList(csv, 'pumps');
		expect(result.preview.headerErrors).toEqual([]);
		expect(result.written).toBe(2);
		const [q700] = await db.select().from(pumpModels).where(eq(pumpModels.id, 'pump-q700'));
		expect(q700).toMatchObject({
			name: 'Quiet pump Q-700, 3 m cord',
			watts: 60,
			priceCents: 19900,
			costCents: null,
			active: true,
			curve: [
				{ flowGph: 0, headFt: 9 },
				{ flowGph: 350, headFt: 7 },
				{ flowGph: 700, headFt: 0 }
			]
		});
		const catalog = await loadCatalog();
		expect(catalog.pumps!.find((p) => p.id === 'pump-s900')).toMatchObject({
			priceCents: 25050,
			costCents: 13100,
			watts: 90
		});
		expect(catalog.pumps).toHaveLength(5);
	});

	it('writes nothing when one row is wrong, and says which row and why', async () => {
		const before = await snapshot();
		const csv = [
			PUMPS,
			'pump-q700,Quiet pump,60,199.00,,0:9;350:7;700:0',
			'pump-s900,Submersible pump S-900,90,250.50,131.00,0:12;600:13;1100:0'
		].join('\n');
		const result = await importPriceList(csv, 'auto');
		expect(result.written).toBe(0);
		expect(result.preview.list).toBe('pumps');
		expect(result.preview.rows.map((r) => [r.line, r.errors])).toEqual([
			[2, []],
			[3, ['curve_gph_ft: point 2 “600:13”: head must not be higher than the point before']]
		]);
		expect(await snapshot()).toEqual(before);
	});
});

describe('labor rates and task hours', () => {
	it('writes rates, the default rate and task hours, keeping the other settings', async () => {
		const before = await snapshot();
		const csv = [
			LABOR,
			'rate,installer,Installer,,,40.00,90.00,no',
			'rate,mason,Stone mason,,,48.00,120.00,yes',
			'task,basin,Set a basin,basin,9.5,,,',
			'task,stone-team-lift,Team lift,stone,1,,,'
		].join('\n');
		// The rate list's default: 4 person-hours to set a basin (common practice, no source).
		expect(laborHoursFor(await loadCatalog(), /^Set the basin/)).toBe(4);
		const result = await importPriceList(csv);
		expect(result.written).toBe(4);
		const rates = await db.select().from(laborRates).orderBy(laborRates.id);
		expect(rates.map((r) => [r.id, r.costPerHourCents, r.pricePerHourCents])).toEqual([
			['installer', 4000, 9000],
			['mason', 4800, 12000]
		]);
		const catalog = await loadCatalog();
		const engine = before.settings[0].engine as Record<string, unknown>;
		expect(catalog.settings).toMatchObject({
			markupPercent: engine.markupPercent,
			taxRatePercent: engine.taxRatePercent,
			labor: { rateId: 'mason', rates: { basin: 9.5, 'stone-team-lift': 1 } }
		});
		// The estimate a salesperson builds now uses the new hours and the mason's rate.
		expect(laborHoursFor(catalog, /^Set the basin/)).toBe(9.5);
		const priced = runEngine(demoDesign(), catalog);
		if (!priced.ok) throw new Error('the demo design should price');
		const { laborCents, laborHours } = priced.pricing.base;
		expect(Math.abs(laborCents - laborHours * 12000)).toBeLessThanOrEqual(0.5);
	});

	it('writes nothing when one row is wrong', async () => {
		const before = await snapshot();
		const csv = [
			LABOR,
			'rate,mason,Stone mason,,,48.00,120.00,yes',
			'task,basin,Set a basin,basin,-2,,,'
		].join('\n');
		const result = await importPriceList(csv, 'labor');
		expect(result.written).toBe(0);
		expect(result.preview.rows[1].errors).toEqual(['hours must not be negative']);
		expect(await snapshot()).toEqual(before);
	});
});

describe('labor rates on the price list page', () => {
	const postRates = (user: { id: string; role: string }, fields: Record<string, string>) => {
		const body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.append(k, v);
		const url = 'http://127.0.0.1/office/price-list?/rates';
		return pageActions.rates({
			locals: { user: { ...user, email: `${user.role}@test.example`, name: user.role } },
			url: new URL(url),
			request: new Request(url, { method: 'POST', body })
		} as never);
	};
	const current = async () =>
		Object.fromEntries(
			taskHours((await db.select().from(estimatingSettings))[0]?.engine).map((t) => [
				t.spec.id,
				String(t.hours)
			])
		);
	const crew = { baseCrewSize: '3', machineDigAboveYd3: '2', truckCapacityTons: '12' };

	it('the owner sets each rate; the estimate then digs and sets stones at the firm’s rates', async () => {
		const owner = await makeUser('owner');
		const fields = { ...(await current()), ...crew, 'dig-hand': '4', 'stone-hoist': '1.5' };
		expect(Object.keys(fields)).toEqual(expect.arrayContaining(LABOR_TASKS.map((t) => t.id)));
		expect(await postRates(owner, fields)).toEqual({ form: 'rates', saved: 'rates' });
		const catalog = await loadCatalog();
		expect(catalog.settings).toMatchObject({
			labor: {
				baseCrewSize: 3,
				machineDigAboveYd3: 2,
				rates: { 'dig-hand': 4, 'stone-hoist': 1.5 }
			},
			equipment: { truckCapacityTons: 12 }
		});
		// The demo basin, 48 ft³ = 1.78 yd³ by hand, at the firm's 4 person-hours a yd³.
		expect(laborHoursFor(catalog, /^Dig the basin/)).toBeCloseTo((48 / 27) * 4, 9);
		// The tall column by hoist: 1.5 h for its team of 4.
		expect(laborHoursFor(catalog, /^Set Tall basalt column/)).toBeCloseTo(6, 9);
	});

	it('refuses a negative or missing rate beside its field and writes nothing; sales may not post', async () => {
		const owner = await makeUser('owner');
		const sales = await makeUser('sales');
		const before = await snapshot();
		const fields = { ...(await current()), ...crew, 'dig-hand': '-1', fixture: '' };
		const refused = (await postRates(owner, fields)) as unknown as {
			status: number;
			data: { errors: Record<string, string> };
		};
		expect(refused.status).toBe(400);
		expect(refused.data.errors).toMatchObject({
			'dig-hand': 'Must not be negative',
			fixture: 'Enter a number'
		});
		await expect(postRates(sales, { ...(await current()), ...crew })).rejects.toMatchObject({
			status: 403
		});
		expect(await snapshot()).toEqual(before);
	});
});

describe('export and import again', () => {
	it('gives back the same price list for each of the three lists', async () => {
		for (const list of ['items', 'pumps', 'labor'] as const) {
			const before = await snapshot();
			const csv = await exportPriceList(list);
			const result = await importPriceList(csv);
			expect(result.preview.list).toBe(list);
			expect(result.preview.ok).toBe(true);
			expect(result.written).toBeGreaterThan(0);
			expect(await exportPriceList(list)).toBe(csv);
			const after = await snapshot();
			const strip = (rows: Record<string, unknown>[]) =>
				rows.map(({ updatedAt: _u, createdAt: _c, ...rest }) => rest);
			expect(strip(after.items)).toEqual(strip(before.items));
			expect(strip(after.pumps)).toEqual(strip(before.pumps));
			expect(strip(after.rates)).toEqual(strip(before.rates));
		}
		// The labor round trip writes the engine's task hours out in full; the engine reads the same.
		const catalog = await loadCatalog();
		expect(laborHoursFor(catalog, /^Set the basin/)).toBe(4);
	});
});

describe('who may import', () => {
	const post = (user: { id: string; role: string }, action: 'preview' | 'commit', csv: string) => {
		const body = new FormData();
		body.append('csv', csv);
		body.append('list', 'auto');
		const url = `http://127.0.0.1/office/price-list/import?/${action}`;
		return actions[action]({
			locals: { user: { ...user, email: `${user.role}@test.example`, name: user.role } },
			url: new URL(url),
			request: new Request(url, { method: 'POST', body })
		} as never);
	};

	it('lets the owner import through the page and refuses sales, who may still export', async () => {
		const owner = await makeUser('owner');
		const sales = await makeUser('sales');
		const csv = `${PUMPS}\npump-q700,Quiet pump,60,199.00,,0:9;700:0\n`;
		await expect(post(sales, 'commit', csv)).rejects.toMatchObject({ status: 403 });
		await expect(post(sales, 'preview', csv)).rejects.toMatchObject({ status: 403 });
		expect(await db.select().from(pumpModels).where(eq(pumpModels.id, 'pump-q700'))).toEqual([]);
		expect(await post(owner, 'commit', csv)).toEqual({ written: 1, writtenList: 'pumps' });
		expect(await db.select().from(pumpModels).where(eq(pumpModels.id, 'pump-q700'))).toHaveLength(
			1
		);
		const url = new URL('http://127.0.0.1/office/price-list/export?list=pumps');
		const res = await exportRoute({
			locals: { user: { ...sales, name: 'sales' } },
			url
		} as never);
		expect(res.headers.get('content-disposition')).toContain('price-list-pumps.csv');
		expect(await res.text()).toContain('pump-q700,Quiet pump,60,199.00,,0:9;700:0\r\n');
	});
});

describe('imported task hours and the visit notes', () => {
	it('start the estimate with the firm’s rates for rocky soil, a steep slope and a narrow gate', async () => {
		const csv = [LABOR, 'task,basin,Dig,basin,10,,,', 'task,stone-cart,Cart,stone,1.5,,,'].join(
			'\n'
		);
		expect((await importPriceList(csv)).written).toBe(2);
		const sales = await makeUser('sales');
		const lead = await makeLead(sales.id);
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
				spotLengthFt: 10,
				spotWidthFt: 8,
				slope: 'steep',
				soil: 'rocky',
				accessWidthIn: 22,
				notes: 'Side gate only'
			},
			notesUpdatedAt: end
		} as typeof siteVisits.$inferInsert);
		const row = (await getEstimate((await createEstimate(lead.id, sales))!))!;
		const design = row.design as {
			site: { soil: string };
			walls: { optionId?: string; exposedHeightIn: number }[];
			extraLabor: { task: string; hours: number }[];
		};
		expect(design.site.soil).toBe('rocky');
		expect(design.walls[0]).toMatchObject({ exposedHeightIn: 30 });
		expect(design.walls[0].optionId).toBeUndefined();
		expect(design.extraLabor.map((t) => [t.task.split(':')[0], t.hours])).toEqual([
			// Half the firm's 10 h basin.
			['Cut and level the pad on a steep slope', 5],
			// The stones' set crew-hours once more: the firm's 1.5 h a stone by cart, the default 1 h
			// by hoist, each for the 4 people the stone needs (the four accent boulders ride a cart).
			['Move Low basalt column in by hand', 6],
			['Move Middle basalt column in by hand', 6],
			['Move Tall basalt column in by hand', 4],
			['Move Granite accent boulders in by hand', 24]
		]);
		expect(row.scope).toBe('Side gate only\nSite: steep slope, rocky soil, access 22 in wide');
		// The wall's footing joins the base work on the steep slope: with the basin that is more than
		// 3 bank yd³ to dig, so a machine digs it; the cable trench is still dug by hand, at the
		// rocky-ground rate (common practice, no source).
		const tasks = (
			row.result as { engine: { labor: { tasks: { task: string; basis: string }[] } } }
		).engine.labor.tasks;
		expect(tasks.map((t) => t.task)).toContain('Dig the basin (machine)');
		expect(tasks.find((t) => t.task === 'Trench and lay lighting cable')?.basis).toMatch(/rocky/i);
	});
});
