import { describe, expect, it } from 'vitest';
import { centsToDollarText, formatCents, parseDollars } from './money';

describe('money', () => {
	it('formats cents with thousands and two decimals', () => {
		expect(formatCents(0)).toBe('$0.00');
		expect(formatCents(5)).toBe('$0.05');
		expect(formatCents(123456789)).toBe('$1,234,567.89');
		expect(formatCents(-1050)).toBe('−$10.50');
	});
	it('reads dollars without floating point and refuses the rest', () => {
		expect(parseDollars('12.5')).toBe(1250);
		expect(parseDollars('$1,204.07')).toBe(120407);
		expect(parseDollars('0.29')).toBe(29);
		expect(parseDollars('-1')).toBeNull();
		expect(parseDollars('1.234')).toBeNull();
		expect(parseDollars('abc')).toBeNull();
		expect(centsToDollarText(120407)).toBe('1204.07');
	});
});
