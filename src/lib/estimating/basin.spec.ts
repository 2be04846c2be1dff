import { describe, expect, it } from 'vitest';
import { basinBudget, basinPlan } from './basin';
import { settingsSchema, type Basin } from './schema';
import { fromSI, gph, toSI } from './units';

const settings = settingsSchema.parse({});
const toGal = (m3: number) => fromSI(m3, 'volume', 'gal');

const rect = (overrides: Partial<Basin> = {}): Basin => ({
	size: { shape: 'rectangle', lengthFt: 6, widthFt: 4, depthFt: 2 },
	fill: { kind: 'open' },
	pumpMinLevelIn: 6,
	freeboardIn: 2,
	extraDrainBackGal: 0,
	...overrides
});

const budget = (basin: Basin, extra: Partial<Parameters<typeof basinBudget>[0]> = {}) =>
	basinBudget({
		basin,
		pipeDrainBackM3: 0,
		wettedStoneAreaM2: 0,
		wettedFaceM2: 0,
		flowM3s: 0,
		settings,
		...extra
	});

describe('basin capacity (US gallon = 231 in³, NIST Handbook 44)', () => {
	it('an open 6 × 4 × 2 ft basin holds 48 ft³ = 359.06 gal', () => {
		expect(toGal(budget(rect()).waterCapacityM3)).toBeCloseTo((48 * 1728) / 231, 6);
	});

	it('filled with gravel at 35% voids it holds 35% of that', () => {
		const gravel = budget(rect({ fill: { kind: 'gravel', voidFraction: 0.35 } }));
		expect(toGal(gravel.waterCapacityM3)).toBeCloseTo(0.35 * 359.0649, 3);
		expect(gravel.openWaterDepthM).toBe(0);
	});

	it('a round basin uses πd²/4 and a nominal capacity gives its area back', () => {
		const round = basinPlan(rect({ size: { shape: 'circle', diameterFt: 4, depthFt: 1 } }));
		expect(fromSI(round.areaM2, 'area', 'ft2')).toBeCloseTo(Math.PI * 4, 9);
		const nominal = basinPlan(rect({ size: { shape: 'capacity', gallons: 150, depthFt: 2 } }));
		expect(fromSI(nominal.areaM2 * nominal.depthM, 'volume', 'gal')).toBeCloseTo(150, 9);
	});

	it('the usable reserve lies between the pump’s lowest safe level and the running level', () => {
		// 24 in deep − 2 in freeboard − 6 in pump level = 16 in over 24 ft² = 32 ft³.
		expect(fromSI(budget(rect()).usableReserveM3, 'volume', 'ft3')).toBeCloseTo(32, 9);
	});
});

// Evaporation 0.25 in/day, splash 0.05 %/day of the water circulated over a 12 h run, a 1 mm wet
// film and a minimum of 3 days between top-ups are the schema's defaults: invented defaults, no source.
describe('daily loss and top-ups (invented defaults, no source)', () => {
	it('evaporation is open surface × rate (invented default, no source): 24 ft² at 0.25 in/day = 0.5 ft³ = 3.74 gal a day', () => {
		expect(toGal(budget(rect()).evaporationM3PerDay)).toBeCloseTo((0.5 * 1728) / 231, 6);
	});

	it('under gravel only the wet stone faces evaporate (common practice, no source)', () => {
		const gravel = rect({ fill: { kind: 'gravel', voidFraction: 0.35 } });
		expect(budget(gravel).evaporationM3PerDay).toBe(0);
		// A 12 in across-flats hex column 48 in tall: sides 6 × 6.928 in × 48 in = 1995.3 in² plus
		// its 124.7 in² top = 2120.0 in² = 14.72 ft²; at 0.25 in a day = 530.0 in³ = 2.294 gal.
		const side = 12 / Math.sqrt(3);
		const facesIn2 = 6 * side * 48 + (Math.sqrt(3) / 2) * 144;
		const b = budget(gravel, { wettedFaceM2: toSI(facesIn2, 'area', 'in2') });
		expect(toGal(b.evaporationM3PerDay)).toBeCloseTo((facesIn2 * 0.25) / 231, 6);
		expect(toGal(b.evaporationM3PerDay)).toBeCloseTo(2.294, 3);
	});

	it('splash is a share of the water circulated (invented default, no source): 1000 gph × 12 h × 0.05% = 6 gal a day', () => {
		expect(toGal(budget(rect(), { flowM3s: gph(1000) }).splashM3PerDay)).toBeCloseTo(6, 9);
	});

	it('days between top-ups = reserve / daily loss, and a warning under the 3-day minimum (invented default, no source)', () => {
		const b = budget(rect({ fill: { kind: 'gravel', voidFraction: 0.35 } }), {
			flowM3s: gph(6000)
		});
		// Worked by hand (231 in³ to the gallon, NIST Handbook 44):
		// reserve 32 ft³ × 0.35 voids = 11.2 ft³ = 11.2 × 1728 / 231 = 83.78 gal;
		// no evaporation under the gravel (and no wet stone here);
		// splash 6000 gph × 12 h × 0.05 % = 36 gal a day; 83.78 / 36 = 2.327 days.
		expect(b.daysBetweenTopUps!).toBeCloseTo(2.327, 3);
		expect(b.daysBetweenTopUps!).toBeLessThan(3);
		expect(b.warnings.join(' ')).toMatch(/days between top-ups/);
	});

	it('no loss at all gives no figure for days rather than Infinity', () => {
		const still = basinBudget({
			basin: rect(),
			pipeDrainBackM3: 0,
			wettedStoneAreaM2: 0,
			wettedFaceM2: 0,
			flowM3s: 0,
			settings: { ...settings, evaporationInPerDay: 0 }
		});
		expect(still.daysBetweenTopUps).toBeNull();
	});
});

describe('drain-back (1 mm wet film: invented default, no source)', () => {
	it('counts pipe water, a film on wetted stone, and extra volume, and warns on overflow', () => {
		const basin = rect({ fill: { kind: 'gravel', voidFraction: 0.3 }, extraDrainBackGal: 10 });
		const b = budget(basin, { pipeDrainBackM3: toSI(2, 'volume', 'gal'), wettedStoneAreaM2: 2 });
		expect(toGal(b.drainBackM3)).toBeCloseTo(12 + toGal(2 * 0.001), 9);
		// Room: 24 ft² × 2 in × 0.3 = 1.2 ft³ ≈ 8.98 gal < 12 gal.
		expect(toGal(b.drainBackRoomM3)).toBeCloseTo((1.2 * 1728) / 231, 6);
		expect(b.warnings.join(' ')).toMatch(/overflow/);
	});

	it('warns when freeboard and pump level leave no reserve', () => {
		const b = budget(rect({ pumpMinLevelIn: 20, freeboardIn: 6 }));
		expect(b.usableReserveM3).toBe(0);
		expect(b.warnings.join(' ')).toMatch(/no usable reserve/);
	});
});
