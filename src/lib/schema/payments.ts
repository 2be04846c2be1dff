// Payments recorded by hand and refunds (shared by the office form and the server).
import { z } from 'zod';
import { isDate, latestDateOnEarth } from '$lib/scheduling/zone';
import { centsField } from './money';

/** "1,250.00" or "1250" → 125000 cents; anything else is refused. */
export const moneyCents = z
	.string()
	.trim()
	.min(1, 'Enter the amount')
	.pipe(centsField('Enter an amount like 1250.00'))
	.pipe(z.number().int().positive('Enter an amount above zero'));

const isoDay = z
	.string()
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Pick the date')
	.refine(isDate, 'Pick a real date')
	.refine((v) => v <= latestDateOnEarth(), {
		message: 'The date cannot be in the future'
	});

export const handPaymentSchema = z
	.object({
		kind: z.enum(['deposit', 'progress', 'final'], { message: 'Pick what the payment is for' }),
		method: z.enum(['cheque', 'cash', 'bank_transfer'], { message: 'Pick how it was paid' }),
		amount: moneyCents,
		reference: z.string().trim().max(80, 'Keep the reference under 80 characters'),
		receivedOn: isoDay,
		note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
	})
	.refine((v) => v.method === 'cash' || v.reference.length > 0, {
		path: ['reference'],
		message: 'Enter the cheque number or transfer reference'
	});

export const refundSchema = z.object({
	method: z.enum(['card', 'cheque', 'cash', 'bank_transfer'], {
		message: 'Pick how it was refunded'
	}),
	amount: moneyCents,
	reference: z.string().trim().max(80, 'Keep the reference under 80 characters'),
	receivedOn: isoDay,
	reason: z
		.string()
		.trim()
		.min(3, 'Say why the money goes back')
		.max(500, 'Keep it under 500 characters')
});

export const invoiceSchema = z.object({
	kind: z.enum(['deposit', 'final'], { message: 'Pick the deposit or the final invoice' })
});

export type HandPaymentInput = z.output<typeof handPaymentSchema>;
export type RefundInput = z.output<typeof refundSchema>;
