// Input schemas of purchasing: suppliers, the supplier of a price-list item, an order's date and
// delivery note, and what was received.
import { z } from 'zod';
import { isDate } from '$lib/scheduling/zone';
import { centsField } from './money';

export const supplierSchema = z.object({
	name: z
		.string()
		.trim()
		.min(2, 'Name the supplier')
		.max(120, 'Keep the name under 120 characters'),
	email: z.email('Enter the e-mail orders go to').max(200),
	phone: z.string().trim().max(40, 'Keep the phone under 40 characters').default('')
});

export const itemSupplierSchema = z.object({
	sku: z.string().min(1, 'Pick an item').max(80),
	supplierId: z.string().min(1, 'Pick a supplier').max(40)
});

export const orderUpdateSchema = z.object({
	orderId: z.string().min(1, 'Pick an order'),
	expectedOn: z.union([
		z.literal('').transform(() => null),
		z
			.string()
			.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2027-05-14')
			.refine(isDate, 'That date is not real')
	]),
	deliveryNote: z.string().trim().max(500, 'Keep the note under 500 characters')
});

export const orderIdSchema = z.object({ orderId: z.string().min(1, 'Pick an order') });

export const receiveLineSchema = z.object({
	lineId: z.string().min(1),
	quantity: z.coerce
		.number({ message: 'Enter the quantity that came' })
		.min(0, 'Zero or more')
		.max(100_000, 'That quantity is too large'),
	cost: centsField('Enter the cost such as 412.50')
});
