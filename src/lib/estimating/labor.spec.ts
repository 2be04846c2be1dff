import { describe, expect, it } from 'vitest';
import { laborSummary, laborTasks, type LaborParts } from './labor';
import { demoDesign } from './demo';
import { featureTasks } from './features';
import { catalogSchema, designSchema, settingsSchema } from './schema';
import type { StoneResult } from './stones';
import { toSI } from './units';

// Every hour figure below is one of the schema's starting defaults (schema.ts, labor): invented
// defaults, no source. The literals are written out so that a changed default fails here.
const settings = settingsSchema.parse({});

const stone = (
	name: string,
	method: StoneResult['handling']['method'],
	people: number,
	count = 1,
	optionId?: string
): StoneResult => ({
	id: name,
	name,
	count,
	rock: 'basalt',
	densityKgM3: 2900,
	volumeM3: 0.01,
	weightKg: 29,
	totalWeightKg: 29 * count,
	surfaceM2: 0.3,
	topM2: 0.05,
	wetted: false,
	handling: { method, people },
	optionId
});

// The demo fountain's own tasks: its basin and its three outlets.
const fountainTasks = featureTasks(
	designSchema.parse(demoDesign()),
	[],
	catalogSchema.parse({ settings: {} })
);

const parts = (overrides: Partial<LaborParts> = {}): LaborParts => ({
	features: fountainTasks,
	stones: [],
	aggregates: [],
	walls: [],
	extra: [],
	...overrides
});

describe('task hours from the settings (invented defaults, no source)', () => {
	it('basin, outlets plumbed, and stones by handling method', () => {
		const tasks = laborTasks(
			parts({ stones: [stone('Column', 'hoist', 4), stone('Accent', 'team-lift', 2, 4)] }),
			settings
		);
		const hours = Object.fromEntries(tasks.map((t) => [t.task, t.hours]));
		// Invented defaults, no source: basin 6 h, 1.5 h an outlet, hoist 2 h, team lift 0.75 h a stone.
		expect(hours['Dig and set basin']).toBe(6);
		expect(hours['Plumb outlets']).toBe(4.5); // 3 × 1.5 h
		expect(hours['Set Column (hoist)']).toBe(2);
		expect(hours['Set Accent (team-lift)']).toBe(3); // 4 × 0.75 h
	});

	it('topping by square foot and walls by unit, each in its own bucket', () => {
		const tasks = laborTasks(
			parts({
				features: [],
				aggregates: [
					{
						id: 'a',
						name: 'Pebble',
						sku: 'P',
						areaM2: toSI(100, 'area', 'ft2'),
						depthM: 0.05,
						netVolumeM3: 0.5,
						wastePercent: 0,
						volumeM3: 0.5,
						optionId: 'alt-a'
					}
				],
				walls: [
					{
						id: 'w',
						name: 'Wall',
						purpose: 'seat',
						buriedCourses: 0,
						courses: 3,
						unitsPerCourse: 10,
						units: 30,
						caps: 10,
						heightFromFootingM: 0.5,
						exposedHeightM: 0.4,
						padVolumeM3: 0.1,
						drainVolumeM3: 0,
						needsPermit: false,
						needsEngineering: false,
						optionId: 'wall'
					}
				]
			}),
			settings
		);
		expect(tasks).toEqual([
			{
				bucket: 'alt-a',
				task: 'Spread Pebble',
				// 100 ft² × 0.02 h/ft² (invented default, no source)
				hours: expect.closeTo(2, 9)
			},
			{
				bucket: 'wall',
				task: 'Build Wall',
				// 30 units × 0.1 h a unit (invented default, no source)
				hours: expect.closeTo(3, 9)
			}
		]);
	});
});

describe('crew and days (8 h day and half-day rounding: invented defaults, no source)', () => {
	it('crew is the larger of the base crew and the heaviest stone’s; days round up to half days', () => {
		const tasks = laborTasks(parts({ stones: [stone('Column', 'hoist', 4)] }), settings);
		const summary = laborSummary(tasks, new Set(['base']), 4, settings);
		expect(summary.crewSize).toBe(4);
		// 6 + 4.5 + 2 = 12.5 h over 4 people × 8 h = 0.39 day → half a day.
		expect(summary.totalHours).toBeCloseTo(12.5, 9);
		expect(summary.installDays).toBe(0.5);
	});

	it('excluded options add no hours', () => {
		const tasks = laborTasks(parts({ stones: [stone('Extra', 'cart', 4, 10, 'opt')] }), settings);
		const without = laborSummary(tasks, new Set(['base']), 0, settings);
		const withOption = laborSummary(tasks, new Set(['base', 'opt']), 0, settings);
		// 10 stones × 1 h by cart (invented default, no source)
		expect(withOption.totalHours - without.totalHours).toBeCloseTo(10, 9);
		// Base crew of 2 (invented default, no source)
		expect(without.crewSize).toBe(2);
	});
});
