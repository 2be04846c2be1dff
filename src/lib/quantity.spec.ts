import { describe, expect, it } from 'vitest';
import { formatQuantity } from './quantity';

// The reference is the platform's own number formatter (ECMA-402 Intl.NumberFormat, en-US, at
// most two fraction digits), called here with a fresh instance for every check.
const intl = (q: number) => q.toLocaleString('en-US', { maximumFractionDigits: 2 });

describe('formatQuantity', () => {
	it('writes a whole number as it is, with no decimals', () => {
		expect(formatQuantity(12)).toBe('12');
		expect(formatQuantity(0)).toBe('0');
		expect(formatQuantity(-1)).toBe('-1');
	});
	it('writes a fraction with at most two decimals and no trailing zero, as Intl.NumberFormat en-US does', () => {
		for (const q of [0.5, 2.25, 2.1, 7.125, 1234.5, 0.333333, -2.5, 99999.999]) {
			expect(formatQuantity(q)).toBe(intl(q));
		}
		expect(formatQuantity(2.1)).toBe('2.1');
		expect(formatQuantity(1234.5)).toBe('1,234.5');
		expect(formatQuantity(0.333333)).toBe('0.33');
	});
});
