// Two invented suppliers for the demo price list: stone, gravel and wall units from a quarry,
// everything else (pumps, pipe, fittings, liners, lighting) from a pond supply house. Safe to
// run twice: names and item links that exist are left alone.
import { eq } from 'drizzle-orm';
import {
	itemSuppliers,
	priceListItems,
	pumpModels,
	suppliers
} from '../../src/lib/server/platform/db/schema';
import { newId } from '../../src/lib/server/platform/crypto';
import type { Db } from './shared';

export const DEMO_SUPPLIERS = {
	quarry: {
		name: 'Granite Hollow Quarry',
		email: 'orders@granitehollow.example',
		phone: '(555) 010-3301'
	},
	pond: { name: 'Reedbank Pond Supply', email: 'desk@reedbank.example', phone: '(555) 010-3302' }
};
const FROM_QUARRY = new Set(['stone', 'aggregate', 'wall']);

async function supplierId(db: Db, s: (typeof DEMO_SUPPLIERS)['quarry']): Promise<string> {
	await db
		.insert(suppliers)
		.values({ id: newId(), ...s })
		.onConflictDoNothing({ target: suppliers.name });
	const [row] = await db
		.select({ id: suppliers.id })
		.from(suppliers)
		.where(eq(suppliers.name, s.name));
	return row.id;
}

export async function seedSuppliers(db: Db): Promise<void> {
	const quarry = await supplierId(db, DEMO_SUPPLIERS.quarry);
	const pond = await supplierId(db, DEMO_SUPPLIERS.pond);
	const items = await db
		.select({ sku: priceListItems.sku, category: priceListItems.category })
		.from(priceListItems);
	const pumps = await db.select({ id: pumpModels.id }).from(pumpModels);
	const links = [
		...items.map((i) => ({ sku: i.sku, supplierId: FROM_QUARRY.has(i.category) ? quarry : pond })),
		...pumps.map((p) => ({ sku: `pump:${p.id}`, supplierId: pond }))
	];
	if (links.length) await db.insert(itemSuppliers).values(links).onConflictDoNothing();
}
