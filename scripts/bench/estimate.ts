// `npm run bench:estimate`: median time of a full estimate (validation, sizing, takeoff, pricing).
// Goal: under 1 ms for the twelve-outlet design, so the builder recomputes on every keystroke.
import { estimate, type Design } from '../../src/lib/estimating/index';
import { demoCatalog, demoDesign } from '../../src/lib/estimating/demo';
import { twelveOutletDesign, yardDesign } from './designs';
import { medianMs, writeResult } from './lib';

async function time(label: string, design: Design) {
	const catalog = demoCatalog();
	const check = estimate(design, catalog);
	if (!check.ok) throw new Error(`${label}: ${JSON.stringify(check.errors)}`);
	const ms = await medianMs(() => estimate(design, catalog), 2000);
	console.log(`${label}: median ${ms.toFixed(3)} ms per full estimate`);
	return ms;
}

const three = await time('3 outlets (demo)', demoDesign());
const twelve = await time('12 outlets, 10 lights and a wall', twelveOutletDesign());
const yard = await time('pond, 3-fall stream, 3-column fountain, lights, wall', yardDesign());
console.log(
	twelve < 1 ? 'Goal met: under 1 ms for twelve outlets' : 'Goal missed: 1 ms for twelve outlets'
);
console.log(yard < 1 ? 'Goal met: under 1 ms for the yard' : 'Goal missed: 1 ms for the yard');
writeResult('estimate', {
	threeOutletMedianMs: three,
	twelveOutletMedianMs: twelve,
	yardMedianMs: yard,
	goalMs: 1,
	goalMet: twelve < 1 && yard < 1
});
