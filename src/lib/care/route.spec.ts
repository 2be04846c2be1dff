import { describe, expect, it } from 'vitest';
import {
	haversineKm,
	nearestNeighbourOrder,
	planSeason,
	travelMinutes,
	type PlanStop
} from './route';

const opts = { depot: { lat: 40, lng: -105 }, speedKmh: 60, roadFactor: 1 };
// One hundredth of a degree of latitude is 1.112 km on this sphere (2πR/36000, R = 6371.0088 km).
const north = (id: string, hundredths: number, minutes = 30): PlanStop => ({
	id,
	lat: 40 + hundredths / 100,
	lng: -105,
	minutes,
	windowStart: '2027-09-01',
	windowEnd: '2027-10-14'
});

describe('haversineKm', () => {
	it('matches the worked example of Nashville BNA to Los Angeles LAX', () => {
		// Rosetta Code, "Haversine formula": 2887.2599506 km with R = 6372.8 km; scaled to our radius.
		const km = haversineKm({ lat: 36.12, lng: -86.67 }, { lat: 33.94, lng: -118.4 });
		expect(km * (6372.8 / 6371.0088)).toBeCloseTo(2887.26, 1);
	});
	it('gives 111.2 km for one degree of latitude', () => {
		// 2πR/360 with the IUGG mean radius 6371.0088 km = 111.195 km.
		expect(haversineKm({ lat: 10, lng: 20 }, { lat: 11, lng: 20 })).toBeCloseTo(111.195, 2);
	});
});

describe('nearestNeighbourOrder', () => {
	it('always goes to the closest point not yet visited', () => {
		const pts = [north('c', 30), north('a', 5), north('b', 12), { ...north('w', 0), lng: -105.2 }];
		// From the depot: a (5.6 km), then b (7.8 km on), then c (20 km on; w is 17 km west of the
		// depot, 20.2 km from b), then w.
		expect(nearestNeighbourOrder(opts.depot, pts).map((p) => p.id)).toEqual(['a', 'b', 'c', 'w']);
	});
});

describe('planSeason', () => {
	const day = (id: string, date: string) => ({
		id,
		day: date,
		startMinute: 8 * 60,
		endMinute: 16 * 60
	});

	it('puts every stop on one day in nearest-neighbour order when the day is long enough', () => {
		const stops = [north('far', 40), north('near', 2), north('mid', 20)];
		const { days, unplaced } = planSeason(stops, [day('d1', '2027-10-01')], opts);
		expect(unplaced).toEqual([]);
		expect(days[0].stops.map((s) => s.id)).toEqual(['near', 'mid', 'far']);
		// 2.2 km at 60 km/h is 3 minutes (rounded up) after 08:00.
		expect(days[0].stops[0].arrive).toBe(8 * 60 + travelMinutes(opts.depot, stops[1], opts));
	});

	it('keeps within the crew hours and spills to the next day', () => {
		const stops = Array.from({ length: 6 }, (_, i) => north(`s${i}`, i + 1, 120));
		const { days, unplaced } = planSeason(
			stops,
			[day('d1', '2027-10-01'), day('d2', '2027-10-02')],
			opts
		);
		for (const d of days) expect(d.endMinute).toBeLessThanOrEqual(16 * 60);
		expect(days[0].stops).toHaveLength(3);
		expect(days[1].stops).toHaveLength(3);
		expect(unplaced).toEqual([]);
	});

	it('never dates a visit outside its window, and reports what did not fit', () => {
		const late = { ...north('late', 1), windowStart: '2027-10-05' };
		const { days, unplaced } = planSeason([late], [day('d1', '2027-10-01')], opts);
		expect(days[0].stops).toEqual([]);
		expect(unplaced).toEqual(['late']);
	});
});
