// The owner's item form on the price list: each refusal comes back beside its field with what was
// typed, and changing an item through the form keeps the engine details it cannot show.
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/platform/db';
import { priceListItems } from '$lib/server/platform/db/schema';
import { loadCatalog } from '$lib/server/pricelist/catalog';
import { actions } from '../../src/routes/office/price-list/+page.server';
import { resetDatabase } from '../support/database';
import { makeUser, seedFirm } from './fixtures';
import { seedCatalog } from './estimates-fixtures';

beforeEach(async () => {
	await resetDatabase();
	await seedFirm();
	await seedCatalog();
});

type Fields = Record<string, string>;

async function postItem(user: { id: string; role: string }, fields: Fields) {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.append(k, v);
	const url = 'http://127.0.0.1/office/price-list?/item';
	return (await actions.item({
		locals: { user: { ...user, email: `${user.role}@test.example`, name: user.role } },
		url: new URL(url),
		request: new Request(url, { method: 'POST', body })
	} as never)) as { status?: number; data?: Record<string, unknown> } & Record<string, unknown>;
}

const good: Fields = {
	sku: 'STONE-SLATE-SLAB',
	name: 'Slate slab, split face',
	category: 'stone',
	unit: 'each',
	unit_cost: '80.00',
	unit_price: '175.50',
	taxable: 'yes',
	tags: 'slab; slate'
};

describe('the price-list item form', () => {
	it('puts each message beside its field, keeps what was typed and writes nothing', async () => {
		const owner = await makeUser('owner');
		const typed = { ...good, name: ' ', unit: 'barrel', unit_cost: 'twelve', unit_price: '-3' };
		const result = await postItem(owner, typed);
		expect(result.status).toBe(400);
		expect(result.data).toMatchObject({
			form: 'item',
			values: typed,
			errors: {
				name: 'Enter a name',
				unit: expect.stringMatching(/^Pick one of each, ft/),
				unit_cost: 'Cost must be dollars and cents, such as 12.50',
				unit_price: 'Price must not be negative'
			}
		});
		expect((result.data!.errors as Fields).sku).toBeUndefined();
		const rows = await db.select().from(priceListItems).where(eq(priceListItems.sku, good.sku));
		expect(rows).toEqual([]);
	});

	it('saves a good item in cents with its tags', async () => {
		const owner = await makeUser('owner');
		expect(await postItem(owner, good)).toEqual({ form: 'item', saved: good.sku });
		const [row] = await db.select().from(priceListItems).where(eq(priceListItems.sku, good.sku));
		expect(row).toMatchObject({
			name: 'Slate slab, split face',
			unitCostCents: 8000,
			unitPriceCents: 17550,
			taxable: true,
			tags: ['slab', 'slate']
		});
	});

	it('changes the price of a pipe and keeps its pipe size, which the form does not show', async () => {
		const owner = await makeUser('owner');
		const [pipe] = await db
			.select()
			.from(priceListItems)
			.where(eq(priceListItems.sku, 'PIPE-S40-075'));
		expect(pipe.attributes).toMatchObject({ pipe: { material: 'pvc-sch40', size: '3/4' } });
		const result = await postItem(owner, {
			sku: pipe.sku,
			name: pipe.name,
			category: pipe.category,
			unit: pipe.unit,
			unit_cost: '0.50',
			unit_price: '1.05',
			taxable: 'yes',
			tags: ''
		});
		expect(result).toEqual({ form: 'item', saved: 'PIPE-S40-075' });
		const item = (await loadCatalog()).items!.find((i) => i.sku === 'PIPE-S40-075');
		expect(item).toMatchObject({ unitPrice: 105, pipe: { material: 'pvc-sch40', size: '3/4' } });
	});

	it('refuses sales', async () => {
		const sales = await makeUser('sales');
		await expect(postItem(sales, good)).rejects.toMatchObject({ status: 403 });
	});
});
