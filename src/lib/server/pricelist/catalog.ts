// The price list: materials and parts, pump models, labor rates and the engine's settings, read
// into the engine's catalog shape; edits by the owner; CSV import (preview first) and export.
import { asc, eq } from 'drizzle-orm';
import { z } from 'zod';
import { catalogSchema, settingsSchema, type Catalog } from '$lib/estimating/schema';
import { db, type Tx } from '../platform/db';
import { estimatingSettings, laborRates, priceListItems, pumpModels } from '../platform/db/schema';
import {
	itemsToCsv,
	laborToCsv,
	previewPriceList,
	pumpsToCsv,
	toCatalogItem,
	withLabor,
	type CsvPreview,
	type ItemRecord,
	type LaborRecord,
	type PriceListKind,
	type PumpRecord
} from './csv';
import { firstNonMonotoneIndex } from '$lib/estimating/pumps';

export async function listItems(): Promise<ItemRecord[]> {
	const rows = await db
		.select()
		.from(priceListItems)
		.where(eq(priceListItems.active, true))
		.orderBy(asc(priceListItems.category), asc(priceListItems.sku));
	return rows.map((r) => ({
		sku: r.sku,
		name: r.name,
		category: r.category,
		unit: r.unit,
		unitCostCents: r.unitCostCents,
		unitPriceCents: r.unitPriceCents,
		taxable: r.taxable,
		tags: r.tags,
		attributes: r.attributes
	}));
}

export async function estimatingConfig() {
	const [row] = await db
		.select()
		.from(estimatingSettings)
		.where(eq(estimatingSettings.id, 1))
		.limit(1);
	return row ?? { id: 1, engine: {}, terms: '', validDays: 30 };
}

/** The catalog the engine reads, built from the price list tables. */
export async function loadCatalog(): Promise<Catalog> {
	const [items, pumps, rates, config] = await Promise.all([
		listItems(),
		db.select().from(pumpModels).where(eq(pumpModels.active, true)).orderBy(asc(pumpModels.watts)),
		db.select().from(laborRates).orderBy(asc(laborRates.id)),
		estimatingConfig()
	]);
	return {
		items: items.map(toCatalogItem) as Catalog['items'],
		pumps: pumps.map((p) => ({
			id: p.id,
			name: p.name,
			curve: p.curve,
			watts: p.watts,
			priceCents: p.priceCents,
			...(p.costCents === null ? {} : { costCents: p.costCents })
		})),
		laborRates: rates.map((r) => ({
			id: r.id,
			name: r.name,
			costPerHourCents: r.costPerHourCents,
			pricePerHourCents: r.pricePerHourCents
		})),
		settings: config.engine as Catalog['settings']
	};
}

export async function upsertItems(items: ItemRecord[], tx: Tx | typeof db = db) {
	for (const item of items) {
		const values = { ...item, active: true };
		await tx
			.insert(priceListItems)
			.values(values)
			.onConflictDoUpdate({ target: priceListItems.sku, set: values });
	}
}

export async function listPumps(): Promise<PumpRecord[]> {
	const rows = await db
		.select()
		.from(pumpModels)
		.where(eq(pumpModels.active, true))
		.orderBy(asc(pumpModels.watts), asc(pumpModels.id));
	return rows.map(({ id, name, watts, priceCents, costCents, curve }) => ({
		id,
		name,
		watts,
		priceCents,
		costCents,
		curve
	}));
}

export async function listLaborRates() {
	const rows = await db.select().from(laborRates).orderBy(asc(laborRates.id));
	return rows.map(({ id, name, costPerHourCents, pricePerHourCents }) => ({
		id,
		name,
		costPerHourCents,
		pricePerHourCents
	}));
}

async function upsertPumps(pumps: readonly PumpRecord[], tx: Tx) {
	for (const pump of pumps) {
		const values = { ...pump, active: true };
		await tx
			.insert(pumpModels)
			.values(values)
			.onConflictDoUpdate({ target: pumpModels.id, set: values });
	}
}

/** Rates by id; task hours and the default rate into the engine's settings, in one row lock. */
async function writeLabor(records: readonly LaborRecord[], tx: Tx) {
	for (const r of records) {
		if (r.kind !== 'rate') continue;
		await tx
			.insert(laborRates)
			.values(r.rate)
			.onConflictDoUpdate({ target: laborRates.id, set: r.rate });
	}
	if (!records.some((r) => r.kind === 'task' || r.isDefault)) return;
	await tx.insert(estimatingSettings).values({ id: 1 }).onConflictDoNothing();
	const [row] = await tx
		.select()
		.from(estimatingSettings)
		.where(eq(estimatingSettings.id, 1))
		.for('update');
	const engine = withLabor(row.engine, records);
	await tx.update(estimatingSettings).set({ engine }).where(eq(estimatingSettings.id, 1));
}

export interface ImportResult {
	preview: CsvPreview;
	written: number;
}

/** Writes only when every row is good; otherwise nothing, and the preview says why. */
export async function importPriceList(
	text: string,
	choice: PriceListKind | 'auto' = 'auto'
): Promise<ImportResult> {
	const preview = previewPriceList(text, choice);
	if (!preview.ok || preview.list === null) return { preview, written: 0 };
	await db.transaction(async (tx) => {
		if (preview.list === 'items') {
			await upsertItems(
				preview.rows.map((r) => r.item!),
				tx
			);
		}
		if (preview.list === 'pumps') {
			await upsertPumps(
				preview.rows.map((r) => r.pump!),
				tx
			);
		}
		if (preview.list === 'labor') {
			await writeLabor(
				preview.rows.map((r) => r.labor!),
				tx
			);
		}
	});
	return { preview, written: preview.rows.length };
}

/** Import with the list told by the file's header row. */
export const importCsv = (text: string) => importPriceList(text, 'auto');

export async function exportPriceList(list: PriceListKind = 'items'): Promise<string> {
	if (list === 'pumps') return pumpsToCsv(await listPumps());
	if (list === 'labor') {
		const [rates, config] = await Promise.all([listLaborRates(), estimatingConfig()]);
		return laborToCsv(rates, config.engine);
	}
	return itemsToCsv(await listItems());
}

export const exportCsv = () => exportPriceList('items');

export async function removeItem(sku: string) {
	await db.update(priceListItems).set({ active: false }).where(eq(priceListItems.sku, sku));
}

const curveText = z
	.string()
	.trim()
	.min(1, 'Enter the curve')
	.transform((text, ctx) => {
		const points = text
			.split(/[\n;]+/)
			.map((l) => l.trim())
			.filter(Boolean)
			.map((l) => l.split(/[\s,]+/).map(Number));
		if (points.some((p) => p.length !== 2 || p.some((n) => !Number.isFinite(n) || n < 0))) {
			ctx.addIssue({ code: 'custom', message: 'One “flow gph, head ft” pair per line' });
			return z.NEVER;
		}
		return points.map(([flowGph, headFt]) => ({ flowGph, headFt }));
	});

const wholeCents = z.coerce
	.number()
	.int('Whole cents')
	.nonnegative('Must not be negative')
	.max(1e9, 'Too large');

export const pumpFormSchema = z.object({
	id: z
		.string()
		.trim()
		.regex(/^[a-z0-9-]{2,40}$/, 'Lower-case letters, digits and dashes'),
	name: z.string().trim().min(1, 'Enter a name').max(120),
	curve: curveText,
	watts: z.coerce.number().int('Whole watts').positive('Above zero').max(100000),
	priceCents: wholeCents,
	costCents: wholeCents
});

export async function savePump(input: z.output<typeof pumpFormSchema>) {
	const check = catalogSchema.safeParse({ pumps: [input] });
	if (!check.success) return check.error.issues.map((i) => i.message);
	if (firstNonMonotoneIndex(input.curve) >= 0) {
		return ['Flow must rise and head must not rise from one point to the next'];
	}
	await db
		.insert(pumpModels)
		.values({ ...input, active: true })
		.onConflictDoUpdate({ target: pumpModels.id, set: { ...input, active: true } });
	return [];
}

export const laborFormSchema = z.object({
	id: z
		.string()
		.trim()
		.regex(/^[a-z0-9-]{2,40}$/, 'Lower-case letters, digits and dashes'),
	name: z.string().trim().min(1, 'Enter a name').max(120),
	costPerHourCents: wholeCents,
	pricePerHourCents: wholeCents
});

export async function saveLaborRate(input: z.output<typeof laborFormSchema>) {
	await db
		.insert(laborRates)
		.values(input)
		.onConflictDoUpdate({ target: laborRates.id, set: input });
}

const pct = z.coerce.number().min(0, 'Not negative').max(100, 'At most 100');
export const settingsFormSchema = z.object({
	markupPercent: z.coerce.number().min(0, 'Not negative').max(500, 'At most 500'),
	taxRatePercent: pct,
	depositPercent: pct,
	electricityCentsPerKwh: z.coerce.number().min(0, 'Not negative').max(500),
	evaporationInPerDay: z.coerce.number().min(0, 'Not negative').max(5, 'At most 5 in a day'),
	pumpMarginPercent: pct,
	validDays: z.coerce.number().int('Whole days').min(1, 'At least a day').max(365),
	terms: z.string().trim().max(5000)
});

export async function saveEstimatingSettings(input: z.output<typeof settingsFormSchema>) {
	const current = await estimatingConfig();
	const { validDays, terms, ...engineFields } = input;
	const engine = { ...current.engine, ...engineFields };
	const check = settingsSchema.safeParse(engine);
	if (!check.success) return check.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
	await db
		.insert(estimatingSettings)
		.values({ id: 1, engine, validDays, terms })
		.onConflictDoUpdate({ target: estimatingSettings.id, set: { engine, validDays, terms } });
	return [];
}
