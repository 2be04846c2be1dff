// Planning a season's service visits into crew days: pure, no I/O. Distances are great-circle
// (haversine) between coordinates; travel time is that distance stretched by a road factor at
// an average speed. Each crew day starts and ends at the firm's yard; visits are taken greedily
// by nearest neighbour from the current stop among those whose window includes the day and that
// still fit the crew's hours (with the drive back), so each day is a nearest-neighbour route and
// days fill with visits that lie close together.

export interface Point {
	lat: number;
	lng: number;
}

export interface PlanStop extends Point {
	id: string;
	minutes: number;
	/** Inclusive "YYYY-MM-DD" window. */
	windowStart: string;
	windowEnd: string;
}

export interface CrewDay {
	id: string;
	day: string;
	startMinute: number;
	endMinute: number;
}

export interface RouteOptions {
	depot: Point;
	speedKmh: number;
	/** Road distance over straight-line distance (common practice, no source: about 1.3). */
	roadFactor: number;
}

export interface PlannedDay {
	crewDayId: string;
	day: string;
	stops: { id: string; arrive: number; leave: number }[];
	endMinute: number;
}

/** Mean Earth radius in km (IUGG mean radius R1, 6371.0088 km). */
const EARTH_KM = 6371.0088;
const rad = (deg: number) => (deg * Math.PI) / 180;

/** Great-circle distance in km by the haversine formula. */
export function haversineKm(a: Point, b: Point): number {
	const dLat = rad(b.lat - a.lat);
	const dLng = rad(b.lng - a.lng);
	const h =
		Math.sin(dLat / 2) ** 2 + Math.cos(rad(a.lat)) * Math.cos(rad(b.lat)) * Math.sin(dLng / 2) ** 2;
	return 2 * EARTH_KM * Math.asin(Math.min(1, Math.sqrt(h)));
}

export function travelMinutes(
	a: Point,
	b: Point,
	o: Pick<RouteOptions, 'speedKmh' | 'roadFactor'>
): number {
	return Math.ceil(((haversineKm(a, b) * o.roadFactor) / o.speedKmh) * 60);
}

/** Nearest-neighbour order from a start over every point (ties keep the input order). */
export function nearestNeighbourOrder<T extends Point>(start: Point, points: readonly T[]): T[] {
	const left = [...points];
	const out: T[] = [];
	let here = start;
	while (left.length) {
		let best = 0;
		let bestKm = Infinity;
		for (let i = 0; i < left.length; i++) {
			const km = haversineKm(here, left[i]);
			if (km < bestKm) {
				bestKm = km;
				best = i;
			}
		}
		here = left[best];
		out.push(left.splice(best, 1)[0]);
	}
	return out;
}

/**
 * Fills crew days in date order. Returns the days with their stops (in route order) and the
 * visits that did not fit any day of their window.
 */
export function planSeason(
	stops: readonly PlanStop[],
	days: readonly CrewDay[],
	o: RouteOptions
): { days: PlannedDay[]; unplaced: string[] } {
	const left = new Set(stops);
	const planned: PlannedDay[] = [];
	const sorted = [...days].sort((a, b) => a.day.localeCompare(b.day) || a.id.localeCompare(b.id));
	for (const crewDay of sorted) {
		const day: PlannedDay = {
			crewDayId: crewDay.id,
			day: crewDay.day,
			stops: [],
			endMinute: crewDay.startMinute
		};
		let here: Point = o.depot;
		let clock = crewDay.startMinute;
		for (;;) {
			let best: PlanStop | null = null;
			let bestKm = Infinity;
			for (const s of left) {
				if (s.windowStart > crewDay.day || s.windowEnd < crewDay.day) continue;
				const km = haversineKm(here, s);
				if (km >= bestKm) continue;
				const arrive = clock + travelMinutes(here, s, o);
				const home = travelMinutes(s, o.depot, o);
				if (arrive + s.minutes + home > crewDay.endMinute) continue;
				best = s;
				bestKm = km;
			}
			if (!best) break;
			const arrive = clock + travelMinutes(here, best, o);
			clock = arrive + best.minutes;
			day.stops.push({ id: best.id, arrive, leave: clock });
			left.delete(best);
			here = best;
		}
		day.endMinute = clock + (day.stops.length ? travelMinutes(here, o.depot, o) : 0);
		planned.push(day);
	}
	return { days: planned, unplaced: [...left].map((s) => s.id) };
}
