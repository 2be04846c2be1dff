import { describe, expect, it } from 'vitest';
import { formFields } from './form-state';

describe('formFields', () => {
	const refused = {
		form: 'refund',
		values: { amount: '12x', reason: '' },
		errors: { amount: 'Enter an amount such as 120.50' }
	};

	it('refills a refused form with what was typed and puts each message by its field', () => {
		const f = formFields(refused, 'refund');
		expect(f.mine).toBe(refused);
		expect(f.value('amount')).toBe('12x');
		expect(f.value('reason', 'default')).toBe('');
		expect(f.value('method', 'cheque')).toBe('cheque');
		expect(f.error('amount')).toBe('Enter an amount such as 120.50');
		expect(f.error('reason')).toBeUndefined();
	});

	it('leaves a form alone when the answer is about another form of the page', () => {
		const f = formFields(refused, 'record');
		expect(f.mine).toBeNull();
		expect(f.value('amount', '0')).toBe('0');
		expect(f.error('amount')).toBeUndefined();
	});

	it('starts a saved form again from its defaults', () => {
		const f = formFields(
			{ form: 'record', saved: 'Payment recorded.', values: { amount: '5' } },
			'record'
		);
		expect(f.value('amount', '')).toBe('');
		expect(formFields(null, 'record').value('note', 'x')).toBe('x');
	});
});
