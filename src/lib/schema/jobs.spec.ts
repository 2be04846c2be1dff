import { describe, expect, it } from 'vitest';
import { fieldErrors } from './auth';
import { changeOrderDraftSchema } from './jobs';

const row = (description: string, quantity: string, unitPrice: string) => ({
	description,
	category: 'lighting',
	unit: 'each',
	quantity,
	unitPrice
});

describe('changeOrderDraftSchema', () => {
	it('leaves out the rows left empty and reads each typed price in cents', () => {
		const parsed = changeOrderDraftSchema.parse({
			title: ' A third uplight ',
			note: '',
			lines: [row('', '', ''), row('Uplight on the column', '2', '185.50'), row('', '', '')]
		});
		expect(parsed).toEqual({
			title: 'A third uplight',
			note: '',
			lines: [
				{
					description: 'Uplight on the column',
					category: 'lighting',
					unit: 'each',
					quantity: 2,
					unitPriceCents: 18550
				}
			]
		});
	});
	it("keys each message by the form's own row and input, the title's with them", () => {
		const parsed = changeOrderDraftSchema.safeParse({
			title: '',
			note: '',
			lines: [row('', '', ''), row('Uplight', 'two', '149.50'), row('Stone step', '1', 'lots')]
		});
		expect(parsed.success).toBe(false);
		expect(fieldErrors(parsed.error!)).toEqual({
			title: 'Give the change a short title',
			'lines.1.quantity': 'Enter a quantity such as 2 or -1',
			'lines.2.unitPrice': 'Enter a price such as 120.50'
		});
	});
	it('asks for a line when every row is empty', () => {
		const parsed = changeOrderDraftSchema.safeParse({
			title: 'Nothing yet',
			note: '',
			lines: [row('', '', ''), row('', '', '')]
		});
		expect(parsed.success).toBe(false);
		expect(fieldErrors(parsed.error!)).toEqual({ lines: 'Add at least one line' });
	});
});
