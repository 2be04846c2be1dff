import { describe, expect, it } from 'vitest';
import { areaFt2, edgesCross, outline, reshape } from './geometry';

describe('plan geometry', () => {
	it('gives the area the engine prices, in square feet', () => {
		expect(areaFt2({ shape: 'rectangle', lengthFt: 8, widthFt: 6 })).toBeCloseTo(48, 9);
		// A circle of 4 ft across: π × 2² = 12.566 ft² (geometry).
		expect(areaFt2({ shape: 'circle', diameterFt: 4 })).toBeCloseTo(12.566, 3);
		// An L-shaped bed: a 10 × 4 strip and a 4 × 4 leg = 56 ft² (shoelace, by hand).
		const l = areaFt2({
			shape: 'polygon',
			pointsFt: [
				[0, 0],
				[10, 0],
				[10, 4],
				[4, 4],
				[4, 8],
				[0, 8]
			]
		});
		expect(l).toBeCloseTo(56, 9);
	});

	it('finds crossing edges (corners out of order) and accepts a simple figure', () => {
		const square: [number, number][] = [
			[0, 0],
			[4, 0],
			[4, 4],
			[0, 4]
		];
		expect(edgesCross(square)).toBe(false);
		const bowtie: [number, number][] = [
			[0, 0],
			[4, 4],
			[4, 0],
			[0, 4]
		];
		expect(edgesCross(bowtie)).toBe(true);
		expect(
			edgesCross([
				[0, 0],
				[1, 0],
				[0, 1]
			])
		).toBe(false);
	});

	it('turns a rectangle into the same polygon and back', () => {
		const poly = reshape({ shape: 'rectangle', lengthFt: 8, widthFt: 6 }, 'polygon');
		expect(poly).toEqual({
			shape: 'polygon',
			pointsFt: [
				[0, 0],
				[8, 0],
				[8, 6],
				[0, 6]
			]
		});
		expect(areaFt2(poly)).toBeCloseTo(48, 9);
		expect(reshape(poly, 'rectangle')).toEqual({ shape: 'rectangle', lengthFt: 8, widthFt: 6 });
	});

	it('centres an outline on the origin', () => {
		const pts = outline({
			shape: 'polygon',
			pointsFt: [
				[10, 10],
				[14, 10],
				[14, 12]
			]
		});
		expect(pts).toEqual([
			[-2, -1],
			[2, -1],
			[2, 1]
		]);
	});
});
