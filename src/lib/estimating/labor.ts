/**
 * Labor in crew-hours, from quantities.
 *
 * THE LABOR MODEL. Every task is people × hours: `people` work on it at once for `hoursEach` clock
 * hours, and its crew-hours (`hours`, what is priced and summed) are people × hoursEach. A task is
 * timed from a quantity (bank yd³ dug, stones set, ft² of wall face, feet of trench) and one of the
 * firm's rates (labor-rates.ts), whose `key` it carries. Build tasks with `rateTask` (from a rate)
 * or `crewTask` (crew-hours already known); never write `hours` by hand, so people × hoursEach
 * always equals hours. Install days follow from the crew-hours, the crew size and the day's hours.
 */
import type { AggregateResult } from './aggregate';
import { laborRateSpec, SOILS, stoneRateKey, type LaborRateKey } from './labor-rates';
import type { LightingResult } from './lighting';
import type { Settings, Site } from './schema';
import type { StoneResult } from './stones';
import { fromSI } from './units';
import type { WallResult } from './walls';

export const BASE_BUCKET = 'base';

export interface LaborTask {
	/** 'base', or the option or alternate choice the work belongs to. */
	bucket: string;
	/** The rate that timed it (a key of LABOR_RATES), or 'extra' for hours typed into the design. */
	key: string;
	/** What the estimate shows. */
	task: string;
	/** People on the task at once. */
	people: number;
	/** Clock hours each of them spends on it. */
	hoursEach: number;
	/** Crew-hours: people × hoursEach. */
	hours: number;
	/** What it was timed from, e.g. "1.8 yd³ × 3 person-h a yd³ (loam, by hand)". */
	basis: string;
}

const bucketOf = (optionId?: string) => optionId ?? BASE_BUCKET;
const yd3 = (m3: number) => fromSI(m3, 'volume', 'yd3');
const ft = (m: number) => fromSI(m, 'length', 'ft');
const ft2 = (m2: number) => fromSI(m2, 'area', 'ft2');
const UNIT_TEXT: Record<string, string> = { yd3: 'yd³', ft2: 'ft²', ft: 'ft' };
const unitText = (unit: string) => UNIT_TEXT[unit] ?? unit;
const num = (x: number) => (Number.isInteger(x) ? String(x) : x.toFixed(x < 10 ? 2 : 1));

/** A task whose crew-hours are known: people × hoursEach = hours. */
export function crewTask(input: {
	bucket: string;
	key: string;
	task: string;
	people: number;
	hours: number;
	basis: string;
}): LaborTask {
	const people = Math.max(1, Math.round(input.people));
	const hours = Math.max(0, input.hours);
	return { ...input, people, hours, hoursEach: hours / people };
}

/**
 * A task timed from one of the firm's rates. A 'person' rate gives crew-hours = quantity × rate
 * (the people only share them out); a 'team' rate gives clock hours for the whole team, so
 * crew-hours = quantity × rate × people. `factor` scales the rate (the soil for digging).
 */
export function rateTask(
	settings: Settings,
	key: LaborRateKey,
	input: {
		bucket: string;
		task: string;
		quantity: number;
		people: number;
		factor?: number;
		note?: string;
	}
): LaborTask {
	const spec = laborRateSpec(key)!;
	const rate = settings.labor.rates[key];
	const factor = input.factor ?? 1;
	const people = Math.max(1, Math.round(input.people));
	const perUnit = rate * factor;
	const hours =
		spec.per === 'person' ? input.quantity * perUnit : input.quantity * perUnit * people;
	const u = unitText(spec.unit);
	const basis =
		(spec.per === 'person'
			? `${num(input.quantity)} ${u} × ${num(perUnit)} person-h a ${u}`
			: `${num(input.quantity)} ${u} × ${num(perUnit)} h a ${u} × ${people} people`) +
		(input.note ? ` (${input.note})` : '');
	return crewTask({ bucket: input.bucket, key, task: input.task, people, hours, basis });
}

/** A piece of ground to dig, in bank (in-place) volume. */
export interface Dig {
	bucket: string;
	/** What is dug, as the estimate names it: "the basin", "Koi pond". */
	what: string;
	volumeM3: number;
}

export interface MachinePlan {
	/** Buckets with a machine on site (the base's machine serves every option too). */
	buckets: Set<string>;
	/** Buckets whose own need brings a machine (the base, or an option when the base has none). */
	lineBuckets: Set<string>;
	/** Buckets needing the larger machine (a stone past the compact loader's limit). */
	larger: Set<string>;
}

const sumBy = <T>(xs: readonly T[], f: (x: T) => number) => xs.reduce((s, x) => s + f(x), 0);

/**
 * Where a machine is on site: wherever a stone's handling plan names one, or the digging of a
 * bucket passes the firm's threshold (or the site is dug by machine), unless the site is dug by
 * hand. A machine in the base serves every option.
 */
export function planMachines(
	digs: readonly Dig[],
	stones: readonly StoneResult[],
	site: Site,
	settings: Settings
): MachinePlan {
	const buckets = new Set([
		...digs.map((d) => d.bucket),
		...stones.map((s) => bucketOf(s.optionId))
	]);
	const needs = (bucket: string) => {
		const dug = yd3(
			sumBy(
				digs.filter((d) => d.bucket === bucket),
				(d) => d.volumeM3
			)
		);
		const byMachine = stones.some(
			(s) =>
				bucketOf(s.optionId) === bucket &&
				(s.handling.method === 'compact-loader' || s.handling.method === 'larger-machine')
		);
		if (byMachine) return true;
		if (site.dig === 'hand' || dug <= 0) return false;
		return site.dig === 'machine' || dug > settings.labor.machineDigAboveYd3;
	};
	const lineBuckets = new Set([...buckets].filter(needs));
	const inBase = lineBuckets.has(BASE_BUCKET);
	if (inBase) for (const b of [...lineBuckets]) if (b !== BASE_BUCKET) lineBuckets.delete(b);
	const withMachine = new Set(inBase ? buckets : lineBuckets);
	if (inBase) withMachine.add(BASE_BUCKET);
	const larger = new Set(
		stones.filter((s) => s.handling.method === 'larger-machine').map((s) => bucketOf(s.optionId))
	);
	return { buckets: withMachine, lineBuckets, larger };
}

/** Digging: by machine where one is on site (and the site is not dug by hand), else by hand. */
export function digTasks(
	digs: readonly Dig[],
	machines: MachinePlan,
	site: Site,
	settings: Settings
): LaborTask[] {
	const soil = SOILS[site.soil];
	return digs
		.filter((d) => d.volumeM3 > 0)
		.map((d) => {
			const byMachine = site.dig !== 'hand' && machines.buckets.has(d.bucket);
			const quantity = yd3(d.volumeM3);
			return byMachine
				? rateTask(settings, 'dig-machine', {
						bucket: d.bucket,
						task: `Dig ${d.what} (machine)`,
						quantity,
						people: settings.machineCrew,
						note: 'bank yd³, operator and helper'
					})
				: rateTask(settings, 'dig-hand', {
						bucket: d.bucket,
						task: `Dig ${d.what} (by hand)`,
						quantity,
						people: settings.labor.baseCrewSize,
						factor: soil.handFactor,
						note: `${soil.label.toLowerCase()}, by hand`
					});
		});
}

export interface LaborParts {
	/** Each feature's own tasks (basins, branches, ponds, streams), already in their buckets. */
	features: readonly LaborTask[];
	/** Every hole the design digs (features, wall trenches), for the digging tasks. */
	digs?: readonly Dig[];
	stones: readonly StoneResult[];
	aggregates: readonly AggregateResult[];
	walls: readonly WallResult[];
	lighting?: { result: LightingResult; optionId?: string };
	extra: readonly { task: string; hours: number; optionId?: string }[];
	/** The site (soil, dig method); loam, chosen by volume, when left out. */
	site?: Site;
	/** Where machines are, when the caller has planned them already (else planned here). */
	machines?: MachinePlan;
}

const DEFAULT_SITE: Site = { soil: 'loam', dig: 'auto', haulSpoil: true };

function lightingTasks(
	lighting: LaborParts['lighting'],
	site: Site,
	settings: Settings
): LaborTask[] {
	if (!lighting) return [];
	const soil = SOILS[site.soil];
	const bucket = bucketOf(lighting.optionId);
	const people = settings.labor.baseCrewSize;
	const trenchFt = sumBy(lighting.result.runs, (r) => ft(r.trenchLengthM));
	return [
		rateTask(settings, 'fixture', {
			bucket,
			task: 'Set and wire lighting fixtures',
			quantity: lighting.result.fixtureCount,
			people
		}),
		rateTask(settings, 'trench', {
			bucket,
			task: 'Trench and lay lighting cable',
			quantity: trenchFt,
			people,
			factor: soil.handFactor,
			note: soil.label.toLowerCase()
		})
	];
}

function wallTasks(wall: WallResult, settings: Settings): LaborTask[] {
	const bucket = bucketOf(wall.optionId);
	const people = settings.labor.baseCrewSize;
	return [
		rateTask(settings, 'wall-base', {
			bucket,
			task: `${wall.name}: pad and first course`,
			quantity: ft(wall.lengthM),
			people
		}),
		rateTask(settings, 'wall-face', {
			bucket,
			task: `${wall.name}: lay ${wall.courses} courses`,
			quantity: ft2(wall.faceAreaM2),
			people,
			note: `${wall.courses} courses, ${wall.buriedCourses} buried`
		})
	];
}

export function laborTasks(parts: LaborParts, settings: Settings): LaborTask[] {
	const site = parts.site ?? DEFAULT_SITE;
	const digs = parts.digs ?? [];
	const machines = parts.machines ?? planMachines(digs, parts.stones, site, settings);
	const tasks: LaborTask[] = [...digTasks(digs, machines, site, settings), ...parts.features];
	for (const stone of parts.stones) {
		tasks.push(
			rateTask(settings, stoneRateKey(stone.handling.method), {
				bucket: bucketOf(stone.optionId),
				task: `Set ${stone.name} (${stone.handling.method}, ${stone.handling.people} people)`,
				quantity: stone.count,
				people: stone.handling.people
			})
		);
	}
	for (const aggregate of parts.aggregates) {
		tasks.push(
			rateTask(settings, 'topping', {
				bucket: bucketOf(aggregate.optionId),
				task: `Spread ${aggregate.name}`,
				quantity: yd3(aggregate.netVolumeM3),
				people: settings.labor.baseCrewSize
			})
		);
	}
	for (const wall of parts.walls) tasks.push(...wallTasks(wall, settings));
	tasks.push(...lightingTasks(parts.lighting, site, settings));
	for (const extra of parts.extra) {
		tasks.push(
			crewTask({
				bucket: bucketOf(extra.optionId),
				key: 'extra',
				task: extra.task,
				people: 1,
				hours: extra.hours,
				basis: 'hours entered in the design'
			})
		);
	}
	return tasks.filter((t) => t.hours > 0);
}

export interface LaborSummary {
	/** Crew-hours of the included tasks: the sum of people × hours. */
	totalHours: number;
	/** The base crew, or more when an included task needs more people at once. */
	crewSize: number;
	/** Crew-hours over the crew's day, rounded up to the next half day. */
	installDays: number;
	/** The crew's paid hours on site over those days (crew × days × the day's hours). */
	onSiteHours: number;
}

export function laborSummary(
	tasks: readonly LaborTask[],
	included: ReadonlySet<string>,
	settings: Settings
): LaborSummary {
	const counted = tasks.filter((t) => included.has(t.bucket));
	const totalHours = sumBy(counted, (t) => t.hours);
	const crewSize = Math.max(settings.labor.baseCrewSize, ...counted.map((t) => t.people));
	const days = totalHours / (crewSize * settings.labor.hoursPerDay);
	const installDays = Math.ceil(days * 2 - 1e-9) / 2;
	return {
		totalHours,
		crewSize,
		installDays,
		onSiteHours: installDays * crewSize * settings.labor.hoursPerDay
	};
}
