import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { aggregateResult, areaM2, shoelaceArea } from './aggregate';
import type { Aggregate, CatalogItem } from './schema';
import { fromSI } from './units';

const ft2 = (m2: number) => fromSI(m2, 'area', 'ft2');

const pebble: CatalogItem = {
	sku: 'P',
	name: 'Pebble',
	category: 'aggregate',
	unit: 'ton',
	unitCost: 0,
	unitPrice: 0,
	bulkDensityLbFt3: 100,
	taxable: true
};

describe('areas', () => {
	it('shoelace: a 3-4-5 right triangle has area 6; a unit square 1, whichever way round', () => {
		expect(
			shoelaceArea([
				[0, 0],
				[4, 0],
				[0, 3]
			])
		).toBe(6);
		expect(
			shoelaceArea([
				[0, 0],
				[0, 1],
				[1, 1],
				[1, 0]
			])
		).toBe(1);
	});

	it('an L-shaped bed of 10 × 10 ft less a 5 × 5 ft corner is 75 ft²', () => {
		const l = areaM2({
			shape: 'polygon',
			pointsFt: [
				[0, 0],
				[10, 0],
				[10, 5],
				[5, 5],
				[5, 10],
				[0, 10]
			]
		});
		expect(ft2(l)).toBeCloseTo(75, 9);
	});

	it('a circle of 10 ft across is 78.54 ft² (πd²/4)', () => {
		expect(ft2(areaM2({ shape: 'circle', diameterFt: 10 }))).toBeCloseTo(78.5398, 3);
	});

	it('property: a rectangle given as four corners has the same area as length × width (fast-check)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.1, max: 200, noNaN: true }),
				fc.double({ min: 0.1, max: 200, noNaN: true }),
				(l, w) => {
					const asPolygon = areaM2({
						shape: 'polygon',
						pointsFt: [
							[0, 0],
							[l, 0],
							[l, w],
							[0, w]
						]
					});
					expect(asPolygon).toBeCloseTo(areaM2({ shape: 'rectangle', lengthFt: l, widthFt: w }), 9);
				}
			)
		);
	});
});

describe('volume and weight (1 yd³ = 27 ft³, NIST Handbook 44)', () => {
	const bed: Aggregate = {
		id: 'a',
		name: 'Bed',
		areas: [{ shape: 'rectangle', lengthFt: 10, widthFt: 10 }],
		depthIn: 3,
		sku: 'P'
	};

	it('10 × 10 ft at 3 in is 25 ft³ = 0.926 yd³ in place; 10% waste (invented default, no source) makes it 27.5 ft³', () => {
		const r = aggregateResult(bed, pebble, 10);
		expect(fromSI(r.netVolumeM3, 'volume', 'ft3')).toBeCloseTo(25, 9);
		expect(fromSI(r.netVolumeM3, 'volume', 'yd3')).toBeCloseTo(25 / 27, 9);
		expect(fromSI(r.volumeM3, 'volume', 'ft3')).toBeCloseTo(27.5, 9);
	});

	it('at 100 lb/ft³ that is 2750 lb = 1.375 short tons', () => {
		const r = aggregateResult(bed, pebble, 10);
		expect(fromSI(r.massKg!, 'mass', 'ton')).toBeCloseTo(1.375, 9);
	});

	it('a design’s own waste allowance wins over the default, and several areas add up', () => {
		const r = aggregateResult(
			{
				...bed,
				wastePercent: 0,
				areas: [...bed.areas, { shape: 'rectangle', lengthFt: 2, widthFt: 5 }]
			},
			undefined,
			10
		);
		expect(fromSI(r.volumeM3, 'volume', 'ft3')).toBeCloseTo(27.5, 9);
		expect(r.massKg).toBeUndefined();
	});
});
