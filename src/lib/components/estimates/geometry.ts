// Plan geometry for the builder and the drawing, in feet. Areas come from the engine's own
// formulas (aggregate.ts), so the figure shown beside a topping is the one it is priced from.
import { areaM2 } from '$lib/estimating/aggregate';
import type { Area } from '$lib/estimating/schema';
import { edgesCross } from '$lib/estimating/polygon';

const FT2_PER_M2 = 1 / (0.3048 * 0.3048);
export type Point = readonly [number, number];

export function areaFt2(area: Area): number {
	const a = areaM2(area);
	return Number.isFinite(a) ? a * FT2_PER_M2 : 0;
}

/**
 * True when two edges that do not share a corner cross (the engine's own check, so the builder
 * and the engine agree).
 */
export { edgesCross };

export interface Box {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

export function boxOf(points: readonly Point[]): Box {
	const xs = points.map((p) => p[0]);
	const ys = points.map((p) => p[1]);
	return {
		minX: Math.min(...xs),
		minY: Math.min(...ys),
		maxX: Math.max(...xs),
		maxY: Math.max(...ys)
	};
}

/** The corners of an area's outline (a circle as a 32-sided figure), centred on the origin. */
export function outline(area: Area): Point[] {
	if (area.shape === 'rectangle') {
		const [l, w] = [area.lengthFt / 2, area.widthFt / 2];
		return [
			[-l, -w],
			[l, -w],
			[l, w],
			[-l, w]
		];
	}
	if (area.shape === 'circle') {
		const r = area.diameterFt / 2;
		return Array.from({ length: 32 }, (_, k) => {
			const t = (k / 32) * 2 * Math.PI;
			return [r * Math.cos(t), r * Math.sin(t)] as const;
		});
	}
	const b = boxOf(area.pointsFt);
	const [cx, cy] = [(b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2];
	return area.pointsFt.map(([x, y]) => [x - cx, y - cy] as const);
}

/** The same area in another shape, keeping its size where the shapes allow. */
export function reshape(area: Area, shape: Area['shape']): Area {
	if (shape === area.shape) return area;
	if (shape === 'polygon') {
		const pts =
			area.shape === 'circle' ? outline(area).filter((_, k) => k % 4 === 0) : outline(area);
		return { shape, pointsFt: pts.map(([x, y]) => [round(x - pts[0][0]), round(y - pts[0][1])]) };
	}
	const b = boxOf(outline(area));
	const [l, w] = [round(b.maxX - b.minX) || 1, round(b.maxY - b.minY) || 1];
	return shape === 'circle'
		? { shape, diameterFt: Math.max(l, w) }
		: { shape, lengthFt: l, widthFt: w };
}

const round = (x: number) => Math.round(x * 10) / 10;
