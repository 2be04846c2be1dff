// The invented demo price list: items, pump curves, a labor rate and the engine settings from the
// engine's demo catalog (made up for Copperleaf Water & Stone). Safe to run twice.
import { demoCatalog } from './demo-catalog';
import { catalogSchema } from '../../src/lib/estimating/schema';
import {
	estimatingSettings,
	laborRates,
	priceListItems,
	pumpModels
} from '../../src/lib/server/platform/db/schema';
import type { Db } from './shared';

export const DEMO_TERMS = [
	'Prices hold for 30 days from the date this estimate was sent.',
	'A deposit is due on acceptance to book the install; the balance is due when the work is complete.',
	'Underground utilities are located through 811 before any digging; rock or buried debris found while digging may change the price, and we agree any change with you first.',
	'Pump and lighting circuits are connected to a ground-fault protected outdoor outlet installed by a licensed electrician (not part of this estimate unless listed).'
].join('\n\n');

export async function seedPriceList(db: Db): Promise<void> {
	const catalog = catalogSchema.parse(demoCatalog());
	for (const item of catalog.items) {
		const { sku, name, category, unit, unitCost, unitPrice, taxable, ...attributes } = item;
		const values = {
			sku,
			name,
			category,
			unit,
			unitCostCents: unitCost,
			unitPriceCents: unitPrice,
			taxable,
			tags: [category],
			attributes
		};
		await db.insert(priceListItems).values(values).onConflictDoNothing();
	}
	for (const pump of catalog.pumps) {
		await db
			.insert(pumpModels)
			.values({ ...pump, costCents: pump.costCents ?? null })
			.onConflictDoNothing();
	}
	for (const rate of catalog.laborRates) {
		await db.insert(laborRates).values(rate).onConflictDoNothing();
	}
	await db
		.insert(estimatingSettings)
		.values({ id: 1, engine: demoCatalog().settings ?? {}, terms: DEMO_TERMS, validDays: 30 })
		.onConflictDoNothing();
}
