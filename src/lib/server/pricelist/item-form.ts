// The owner's "add or change an item" form on the price list: zod checks with each message beside
// its input (the cells share the CSV's dollar check), then the engine's own item check.
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { CATEGORIES } from '$lib/estimating/categories';
import { catalogSchema, ITEM_UNITS } from '$lib/estimating/schema';
import { db } from '../platform/db';
import { priceListItems } from '../platform/db/schema';
import { dollarsCell } from './csv-cells';
import { toCatalogItem, type ItemRecord } from './csv';
import { upsertItems } from './catalog';

export const itemFormSchema = z.object({
	sku: z.string().trim().min(1, 'Enter a SKU').max(60, 'At most 60 characters'),
	name: z.string().trim().min(1, 'Enter a name').max(200, 'At most 200 characters'),
	category: z.enum(CATEGORIES, { message: `Pick one of ${CATEGORIES.join(', ')}` }),
	unit: z.enum(ITEM_UNITS, { message: `Pick one of ${ITEM_UNITS.join(', ')}` }),
	unit_cost: dollarsCell('Cost', '12.50'),
	unit_price: dollarsCell('Price', '24.00'),
	taxable: z.enum(['yes', 'no'], { message: 'Pick yes or no' }).default('yes'),
	tags: z
		.string()
		.max(500, 'At most 500 characters')
		.default('')
		.transform((text) =>
			text
				.split(';')
				.map((t) => t.trim())
				.filter(Boolean)
		)
});

export type ItemFormInput = z.output<typeof itemFormSchema>;

// The engine's names for the fields the form calls by their CSV column.
const FIELD_OF: Record<string, string> = { unitCost: 'unit_cost', unitPrice: 'unit_price' };

/** The stored record for a checked form, or field errors from the engine's own item check. */
export function itemFromForm(
	input: ItemFormInput,
	attributes: Record<string, unknown> = {}
): { item: ItemRecord } | { fieldErrors: Record<string, string> } {
	const item: ItemRecord = {
		sku: input.sku,
		name: input.name,
		category: input.category,
		unit: input.unit,
		unitCostCents: input.unit_cost,
		unitPriceCents: input.unit_price,
		taxable: input.taxable === 'yes',
		tags: input.tags,
		attributes
	};
	const check = catalogSchema.shape.items.unwrap().element.safeParse(toCatalogItem(item));
	if (check.success) return { item };
	const fieldErrors: Record<string, string> = {};
	for (const issue of check.error.issues) {
		const head = String(issue.path[0] ?? '');
		fieldErrors[FIELD_OF[head] ?? (head || 'sku')] ??= issue.message;
	}
	return { fieldErrors };
}

/**
 * Saves the item. The form has no fields for the pipe, fitting or bulk-density details (they come
 * in through the CSV import), so a changed item keeps the ones it had.
 */
export async function saveItem(input: ItemFormInput) {
	const [existing] = await db
		.select({ attributes: priceListItems.attributes })
		.from(priceListItems)
		.where(eq(priceListItems.sku, input.sku))
		.limit(1);
	const result = itemFromForm(input, existing?.attributes ?? {});
	if ('item' in result) await upsertItems([result.item]);
	return result;
}
