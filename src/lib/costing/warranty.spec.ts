import { describe, expect, it } from 'vitest';
import { addMonths, format } from 'date-fns';
import { insideWarranty, warrantyEndsOn } from './warranty';

describe('the warranty period', () => {
	it('adds calendar months as date-fns addMonths does (clamped to the month’s last day)', () => {
		// Checked against date-fns, a general-purpose date library.
		for (const [from, months] of [
			['2027-01-31', 1],
			['2028-01-31', 1],
			['2027-06-15', 12],
			['2027-11-30', 3],
			['2027-05-01', 0]
		] as const) {
			const [y, m, d] = from.split('-').map(Number);
			expect(warrantyEndsOn(from, months)).toBe(
				format(addMonths(new Date(y, m - 1, d), months), 'yyyy-MM-dd')
			);
		}
		expect(warrantyEndsOn('2027-01-31', 1)).toBe('2027-02-28');
		expect(warrantyEndsOn('2028-01-31', 1)).toBe('2028-02-29');
	});

	it('covers the last day and not the day after', () => {
		expect(insideWarranty('2028-06-15', '2028-06-15')).toBe(true);
		expect(insideWarranty('2028-06-16', '2028-06-15')).toBe(false);
	});
});
