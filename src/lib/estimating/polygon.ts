/** Plane polygons in any one length unit: edges that cross, perimeter, bounding box. */
export type Point = readonly [number, number];

const cross = (o: Point, a: Point, b: Point) =>
	(a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);

function segmentsCross(p1: Point, p2: Point, q1: Point, q2: Point): boolean {
	const d1 = cross(q1, q2, p1);
	const d2 = cross(q1, q2, p2);
	const d3 = cross(p1, p2, q1);
	const d4 = cross(p1, p2, q2);
	return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

/**
 * The first pair of edges that do not share a corner and cross, as edge indexes (edge i runs from
 * corner i to corner i + 1), or null. Crossing edges mean the corners are not in order around the
 * outline, and the shoelace area of such a figure is not the area on the ground.
 */
export function crossingEdges(points: readonly Point[]): [number, number] | null {
	const n = points.length;
	if (n < 4) return null;
	for (let i = 0; i < n; i++) {
		for (let j = i + 2; j < n; j++) {
			if (i === 0 && j === n - 1) continue; // neighbours through the closing edge
			if (segmentsCross(points[i], points[(i + 1) % n], points[j], points[(j + 1) % n])) {
				return [i, j];
			}
		}
	}
	return null;
}

export const edgesCross = (points: readonly Point[]) => crossingEdges(points) !== null;

export function perimeter(points: readonly Point[]): number {
	let sum = 0;
	for (let i = 0; i < points.length; i++) {
		const [x1, y1] = points[i];
		const [x2, y2] = points[(i + 1) % points.length];
		sum += Math.hypot(x2 - x1, y2 - y1);
	}
	return sum;
}

export function extent(points: readonly Point[]): { length: number; width: number } {
	let [minX, minY, maxX, maxY] = [Infinity, Infinity, -Infinity, -Infinity];
	for (const [x, y] of points) {
		minX = Math.min(minX, x);
		maxX = Math.max(maxX, x);
		minY = Math.min(minY, y);
		maxY = Math.max(maxY, y);
	}
	const [a, b] = [maxX - minX, maxY - minY];
	return { length: Math.max(a, b), width: Math.min(a, b) };
}

/**
 * Ramanujan's first approximation to an ellipse's perimeter with semi-axes a and b:
 * π [3(a + b) − √((3a + b)(a + 3b))] (S. Ramanujan, "Modular equations and approximations to π",
 * Quart. J. Math. 45, 1914), within a few parts per million for pond-like ovals.
 */
export function ellipsePerimeter(a: number, b: number): number {
	return Math.PI * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)));
}
