import { describe, expect, it } from 'vitest';
import { centsField } from './schema/money';
import { centsToDollarText, centsToFieldText, formatCents, parseCents } from './money';

// The reference for positive US amounts is the platform's own formatter (ECMA-402
// Intl.NumberFormat, en-US, style currency): our figures must read exactly as it writes them.
const intlUsd = (cents: number) =>
	new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100);

describe('formatCents', () => {
	it('writes cents with thousands separators and two decimals, as Intl.NumberFormat en-US does', () => {
		for (const cents of [0, 5, 99, 100, 1250, 120407, 123456789, 99_999_999_99]) {
			expect(formatCents(cents)).toBe(intlUsd(cents));
		}
		expect(formatCents(123456789)).toBe('$1,234,567.89');
	});
	it('writes a negative amount with the minus sign U+2212 before the dollar sign', () => {
		expect(formatCents(-1050)).toBe('−$10.50');
		expect(formatCents(-5)).toBe('−$0.05');
		expect(formatCents(-123456789)).toBe('−$1,234,567.89');
	});
	it('never writes a negative zero', () => {
		expect(formatCents(-0)).toBe('$0.00');
	});
	it('rounds a stray fraction of a cent to the nearest cent', () => {
		expect(formatCents(1249.6)).toBe('$12.50');
	});
	it('writes another currency (one a payment provider reported) with its own symbol', () => {
		// Intl.NumberFormat en-US writes euros as "€12.00" (ECMA-402, CLDR en data).
		expect(formatCents(1200, 'eur')).toBe('€12.00');
		expect(formatCents(1200, 'USD')).toBe('$12.00');
	});
});

describe('centsToDollarText', () => {
	it('fills a money field without a dollar sign or commas', () => {
		expect(centsToDollarText(120407)).toBe('1204.07');
		expect(centsToDollarText(5)).toBe('0.05');
		expect(centsToDollarText(0)).toBe('0.00');
		expect(centsToDollarText(-1050)).toBe('-10.50');
	});
	it('leaves an optional field empty for nothing or zero', () => {
		expect(centsToFieldText(null)).toBe('');
		expect(centsToFieldText(undefined)).toBe('');
		expect(centsToFieldText(0)).toBe('');
		expect(centsToFieldText(15000)).toBe('150.00');
	});
	it('round-trips through parseCents', () => {
		for (const cents of [0, 1, 29, 435, 120407, 99_999_999]) {
			expect(parseCents(centsToDollarText(cents))).toBe(cents);
			expect(parseCents(formatCents(cents))).toBe(cents);
		}
	});
});

describe('parseCents', () => {
	it('reads dollars as people type them', () => {
		expect(parseCents('12')).toBe(1200);
		expect(parseCents('12.5')).toBe(1250);
		expect(parseCents('12.50')).toBe(1250);
		expect(parseCents('$1,204.07')).toBe(120407);
		expect(parseCents(' 80 ')).toBe(8000);
		expect(parseCents('$ 80')).toBe(8000);
	});
	it('never goes through floating point: 4.35 is 435 cents, 0.29 is 29', () => {
		// 4.35 * 100 is 434.99999999999994 in IEEE 754 doubles; a float parser that truncates
		// loses a cent.
		expect(parseCents('4.35')).toBe(435);
		expect(parseCents('0.29')).toBe(29);
		expect(parseCents('1.15')).toBe(115);
	});
	it('refuses negative amounts', () => {
		expect(parseCents('-1')).toBeNull();
		expect(parseCents('-$10.50')).toBeNull();
		expect(parseCents('−10.50')).toBeNull();
	});
	it('refuses what is not an amount', () => {
		for (const bad of [
			'',
			' ',
			'abc',
			'1.234',
			'12.',
			'.5',
			'1e3',
			'0x10',
			'12$',
			'NaN',
			'1.2.3'
		]) {
			expect(parseCents(bad)).toBeNull();
		}
	});
	it('refuses more whole digits than the field allows', () => {
		expect(parseCents('9999999.99')).toBe(999999999);
		expect(parseCents('10000000')).toBeNull();
		expect(parseCents('10000000', { wholeDigits: 9 })).toBe(1_000_000_000);
	});
});

describe('centsField', () => {
	const field = centsField('Enter an amount such as 412.50');
	it('gives cents for an amount', () => {
		expect(field.parse('412.50')).toBe(41250);
	});
	it('puts the form’s own message on anything else', () => {
		const r = field.safeParse('12,5O');
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toBe('Enter an amount such as 412.50');
	});
});
