import { describe, expect, it } from 'vitest';
import { fountainIn } from '../../../tests/support/fountain';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { estimate } from './index';
import { fromSI } from './units';

const run = (
	mutate: (d: ReturnType<typeof demoDesign>) => void = () => {},
	catalog = demoCatalog()
) => {
	const design = demoDesign();
	mutate(design);
	const result = estimate(design, catalog);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
};

// Quantities come from the demo design and demo catalog (invented, no source); rounding rules are
// takeoff.ts's own (invented default, no source).
describe('takeoff lines (demo catalog, invented defaults, no source)', () => {
	const result = run();
	const line = (sku: string) => result.pricing.lines.find((l) => l.sku === sku)!;

	it('sums one SKU across parts before rounding up: three 3/4 in branches of 8, 10 and 12 ft = 30 ft', () => {
		expect(line('PIPE-S40-075').quantity).toBe(30);
		expect(line('PIPE-S40-075').description).toMatch(/Low column.*Middle column.*Tall column/);
	});

	it('counts fittings and valves from the branches: a tee, two elbows and one ball valve per column (demo design, invented, no source)', () => {
		expect(line('FIT-ELL-075').quantity).toBe(6);
		expect(line('VALVE-BALL-075').quantity).toBe(3);
		expect(line('FIT-TEE-075').quantity).toBe(3);
	});

	it('weighs priced-by-ton stone and rounds up to tenths (invented default, no source): three basalt columns ≈ 0.71 t → 0.8 t', () => {
		const tons = fromSI(
			result.stones.stones.slice(0, 3).reduce((s, x) => s + x.totalWeightKg, 0),
			'mass',
			'ton'
		);
		expect(tons).toBeGreaterThan(0.7);
		expect(tons).toBeLessThan(0.8);
		expect(line('STONE-BASALT-COL').quantity).toBe(0.8);
	});

	it('fills the basin with gravel by its gross volume: 48 ft³ at 100 lb/ft³ = 2.4 t (demo catalog density, invented default, no source)', () => {
		// 48 ft³ × 100 lb/ft³ = 4800 lb = 2.4 short tons (2000 lb, NIST Handbook 44).
		expect(line('AGG-GRAVEL-WASHED').quantity).toBe(2.4);
	});

	it('sells slate chips by the 0.5 ft³ bag: 8 × 6 ft at 2 in + 10% = 8.8 ft³ = 18 bags (10% waste and bag size: invented defaults, no source)', () => {
		// 48 ft² × 2/12 ft = 8 ft³; + 10% = 8.8 ft³; 8.8 / 0.5 = 17.6 → 18 bags.
		const slate = result.pricing.lines.find((l) => l.sku === 'AGG-SLATE-CHIP')!;
		expect(slate.bucket).toBe('topping-slate');
		expect(slate.quantity).toBe(18);
	});

	it('puts the optional wall’s lines in its own bucket', () => {
		expect(line('WALL-UNIT-16').bucket).toBe('low-wall');
		expect(line('WALL-CAP-16').quantity).toBe(12);
	});

	it('warns, rather than guesses, when the price list has no item for a pipe', () => {
		const noOneInch = run((d) => {
			fountainIn(d).branches![0].pipe = { material: 'flex-pvc', size: '1' };
		});
		expect(noOneInch.warnings).toContain('No price-list item for 1 in flex-pvc pipe: not priced');
	});
});
