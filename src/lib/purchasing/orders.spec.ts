import { describe, expect, it } from 'vitest';
import { arrivesLate, draftOrders } from './orders';

const m = (id: string, sku: string, quantity: number, unit = 'each') => ({
	id,
	sku,
	name: sku,
	description: '',
	unit,
	quantity
});

describe('purchase orders from a materials list', () => {
	it('makes one order per supplier, at cost, each line rounded once to the cent', () => {
		// Hand-worked: 0.8 ton × 60000 ¢ = 48000; 2.3 ton × 4567 ¢ = 10504.1 → 10504;
		// pump 1 × 29000 → quarry 58504, pond shop 29000; the unknown sku waits for a supplier.
		const cost: Record<string, number> = { STONE: 60_000, PEBBLE: 4_567, PUMP: 29_000, X: 100 };
		const supplier: Record<string, string> = {
			STONE: 'quarry',
			PEBBLE: 'quarry',
			PUMP: 'pond-shop'
		};
		const { orders, withoutSupplier } = draftOrders(
			[
				m('1', 'STONE', 0.8, 'ton'),
				m('2', 'PEBBLE', 2.3, 'ton'),
				m('3', 'PUMP', 1),
				m('4', 'X', 2),
				m('5', 'PUMP', -1)
			],
			(sku) => supplier[sku],
			(sku) => cost[sku]
		);
		expect(orders.map((o) => [o.supplierId, o.totalCents])).toEqual([
			['quarry', 58_504],
			['pond-shop', 29_000]
		]);
		expect(orders[0].lines.map((l) => l.extendedCents)).toEqual([48_000, 10_504]);
		expect(withoutSupplier.map((x) => x.id)).toEqual(['4']);
	});

	it('counts an order late when it has no date or comes on the install day or after', () => {
		expect(arrivesLate(null, '2027-06-02')).toBe(true);
		expect(arrivesLate('2027-06-02', '2027-06-02')).toBe(true);
		expect(arrivesLate('2027-06-05', '2027-06-02')).toBe(true);
		expect(arrivesLate('2027-06-01', '2027-06-02')).toBe(false);
	});
});
