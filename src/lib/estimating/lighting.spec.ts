import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { COPPER_OHMS_PER_KFT, analyseLighting, fixtureVoltages, voltageDrop } from './lighting';
import { settingsSchema, type Lighting } from './schema';
import { feet } from './units';

const settings = settingsSchema.parse({});

const lighting = (
	vas: number[],
	distancesFt: number[],
	tapV = 12,
	gauge: Lighting['runs'][number]['gauge'] = '12',
	ratingVA = 150
): Lighting => ({
	fixtures: vas.map((va, i) => ({ id: `f${i}`, name: `Fixture ${i}`, va })),
	transformers: [{ id: 't', name: 'Transformer', ratingVA, tapsV: [12, 13, 14, 15] }],
	runs: [
		{
			id: 'r',
			transformerId: 't',
			tapV,
			gauge,
			fixtures: vas.map((_, i) => ({ fixtureId: `f${i}`, distanceFt: distancesFt[i] }))
		}
	]
});

describe('copper resistance (NEC Chapter 9, Table 8, stranded uncoated, 75 °C)', () => {
	it('12 AWG is 1.98 Ω/kft; each step to a heavier gauge lowers it', () => {
		expect(COPPER_OHMS_PER_KFT['12']).toBe(1.98);
		const gauges = ['16', '14', '12', '10', '8'] as const;
		for (let i = 1; i < gauges.length; i++) {
			expect(COPPER_OHMS_PER_KFT[gauges[i]]).toBeLessThan(COPPER_OHMS_PER_KFT[gauges[i - 1]]);
		}
	});

	it('worked drop: 8.333 A over 100 ft of 12 AWG (200 ft of conductor) ≈ 3.30 V', () => {
		expect(voltageDrop(8.333, feet(100), '12')).toBeCloseTo(3.3, 2);
	});
});

describe('voltage along a run', () => {
	it('a 100 VA load 100 ft out on the 12 V tap sees 12 − 3.30 = 8.70 V', () => {
		const [f] = fixtureVoltages(
			[{ fixtureId: 'a', name: 'A', distanceM: feet(100), va: 100 }],
			12,
			'12',
			12
		);
		expect(f.volts).toBeCloseTo(8.7, 2);
	});

	it('daisy chain: each stretch carries the fixtures beyond it (50 VA at 50 ft and 100 ft)', () => {
		const [near, far] = fixtureVoltages(
			[
				{ fixtureId: 'b', name: 'B', distanceM: feet(100), va: 50 },
				{ fixtureId: 'a', name: 'A', distanceM: feet(50), va: 50 }
			],
			12,
			'12',
			12
		);
		// 8.333 A over 50 ft drops 1.65 V; then 4.167 A over 50 ft drops 0.825 V.
		expect(near.fixtureId).toBe('a');
		expect(near.volts).toBeCloseTo(10.35, 2);
		expect(far.volts).toBeCloseTo(9.525, 2);
	});

	it('advises the tap that brings every fixture into range', () => {
		const r = analyseLighting(lighting([50, 50], [50, 100]), settings);
		expect(r.runs[0].withinWindow).toBe(false);
		expect(r.runs[0].advice).toBe('Move this run to the 13 V tap');
		expect(r.runs[0].lastFixtureVolts).toBeCloseTo(9.525, 2);
	});

	it('advises a heavier gauge when no tap will do', () => {
		// 16 AWG: the 130 ft between the two 40 VA fixtures alone drops 4.3 V, more than the 2 V
		// window; 14 AWG drops 2.7 V; 12 AWG drops 1.7 V and fits on the 13 V tap.
		const r = analyseLighting(lighting([40, 40], [20, 150], 12, '16'), settings);
		expect(r.runs[0].advice).toBe('Use 12 AWG cable on the 13 V tap');
	});

	it('says to split the run when even the heaviest gauge will not do', () => {
		const r = analyseLighting(lighting([150, 150], [10, 400], 15, '8', 600), settings);
		expect(r.runs[0].advice).toMatch(/split the run/);
	});
});

describe('transformer load', () => {
	it('warns above 80% of the rating (common practice, no source) and reports the ratio', () => {
		const r = analyseLighting(lighting([60, 65], [10, 12], 12, '10'), settings);
		expect(r.transformers[0].loadVA).toBe(125);
		expect(r.transformers[0].loadRatio).toBeCloseTo(125 / 150, 12);
		expect(r.warnings[0]).toMatch(/83%/);
	});

	it('no warning at 80% or under', () => {
		expect(
			analyseLighting(lighting([60, 60], [10, 12], 12, '10'), settings).transformers[0].warnings
		).toEqual([]);
	});

	it('property: adding a fixture never lowers the load (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.array(
					fc.tuple(
						fc.double({ min: 1, max: 100, noNaN: true }),
						fc.double({ min: 0, max: 300, noNaN: true })
					),
					{ minLength: 1, maxLength: 10 }
				),
				fc.double({ min: 1, max: 100, noNaN: true }),
				fc.double({ min: 0, max: 300, noNaN: true }),
				(fixtures, va, distance) => {
					const before = analyseLighting(
						lighting(
							fixtures.map((f) => f[0]),
							fixtures.map((f) => f[1])
						),
						settings
					);
					const after = analyseLighting(
						lighting([...fixtures.map((f) => f[0]), va], [...fixtures.map((f) => f[1]), distance]),
						settings
					);
					expect(after.totalLoadVA).toBeGreaterThanOrEqual(before.totalLoadVA);
					expect(after.runs[0].lowestVolts).toBeLessThanOrEqual(before.runs[0].lowestVolts + 1e-12);
				}
			)
		);
	});
});
