// `npm run bench:care`: planning a season's service visits into crew days, the pure planner the
// season page runs (src/lib/care/route.ts: nearest-neighbour routes within each crew's hours and
// each visit's window). Goal: 600 visits over 25 crew days in under 1 s.
// The visits are spread over a 30 km square around the yard with a fixed seed, 20 minutes each;
// the crew days run 07:00–18:00, weekdays, inside one autumn window.
import { planSeason, type CrewDay, type PlanStop } from '../../src/lib/care/route';
import { medianMs, writeResult } from './lib';
import { addDays, weekdayOf } from '../../src/lib/scheduling/zone';

function random(seed: number) {
	let s = seed >>> 0;
	return () => {
		s = (s * 1664525 + 1013904223) >>> 0;
		return s / 2 ** 32;
	};
}

const rand = random(20_27);
const depot = { lat: 40.0, lng: -105.0 };
const stops: PlanStop[] = Array.from({ length: 600 }, (_, i) => ({
	id: `v${i}`,
	lat: depot.lat + (rand() - 0.5) * 0.27,
	lng: depot.lng + (rand() - 0.5) * 0.35,
	minutes: 20,
	windowStart: '2027-09-03',
	windowEnd: '2027-10-14'
}));
const days: CrewDay[] = [];
for (let day = '2027-09-06'; days.length < 25; day = addDays(day, 1)) {
	if (weekdayOf(day) === 0 || weekdayOf(day) === 6) continue;
	days.push({
		id: `d${days.length}`,
		day,
		startMinute: 420,
		endMinute: 1080
	});
}
const options = { depot, speedKmh: 40, roadFactor: 1.3 };

const result = planSeason(stops, days, options);
const placed = result.days.reduce((n, d) => n + d.stops.length, 0);
const ms = await medianMs(() => planSeason(stops, days, options), 30, 3);
console.log(
	`600 visits over 25 crew days: median ${ms.toFixed(1)} ms (${placed} placed, ${result.unplaced.length} left over)`
);
console.log(ms < 1000 ? 'Goal met: under 1 s' : 'Goal missed: 1 s');
writeResult('care', {
	visits: stops.length,
	crewDays: days.length,
	placed,
	unplaced: result.unplaced.length,
	medianMs: ms,
	goalMs: 1000,
	goalMet: ms < 1000
});
