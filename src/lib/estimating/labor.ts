/** Labor: task hours from the firm's settings, crew size and install days. */
import type { AggregateResult } from './aggregate';
import type { LightingResult } from './lighting';
import type { Settings } from './schema';
import type { StoneResult } from './stones';
import { toFeet, toSI } from './units';
import type { WallResult } from './walls';

export const BASE_BUCKET = 'base';

export interface LaborTask {
	/** 'base', or the option or alternate choice the work belongs to. */
	bucket: string;
	task: string;
	hours: number;
}

export interface LaborParts {
	/** Each feature's own tasks (basins, outlets, ponds, streams), already in their buckets. */
	features: readonly LaborTask[];
	stones: readonly StoneResult[];
	aggregates: readonly AggregateResult[];
	walls: readonly WallResult[];
	lighting?: { result: LightingResult; optionId?: string };
	extra: readonly { task: string; hours: number; optionId?: string }[];
}

const bucketOf = (optionId?: string) => optionId ?? BASE_BUCKET;
const ft2 = (m2: number) => m2 / toSI(1, 'area', 'ft2');

function lightingTasks(lighting: LaborParts['lighting'], hours: Settings['labor']): LaborTask[] {
	if (!lighting) return [];
	const bucket = bucketOf(lighting.optionId);
	const cableFt = lighting.result.runs.reduce((sum, r) => sum + toFeet(r.cableLengthM), 0);
	return [
		{
			bucket,
			task: 'Set lighting fixtures',
			hours: lighting.result.fixtureCount * hours.fixtureHours
		},
		{ bucket, task: 'Lay lighting cable', hours: cableFt * hours.cableHoursPerFt }
	];
}

export function laborTasks(parts: LaborParts, settings: Settings): LaborTask[] {
	const hours = settings.labor;
	const tasks: LaborTask[] = [...parts.features];
	for (const stone of parts.stones) {
		tasks.push({
			bucket: bucketOf(stone.optionId),
			task: `Set ${stone.name} (${stone.handling.method})`,
			hours: stone.count * hours.stoneHours[stone.handling.method]
		});
	}
	for (const aggregate of parts.aggregates) {
		tasks.push({
			bucket: bucketOf(aggregate.optionId),
			task: `Spread ${aggregate.name}`,
			hours: ft2(aggregate.areaM2) * hours.toppingHoursPerFt2
		});
	}
	for (const wall of parts.walls) {
		tasks.push({
			bucket: bucketOf(wall.optionId),
			task: `Build ${wall.name}`,
			hours: wall.units * hours.wallHoursPerUnit
		});
	}
	tasks.push(...lightingTasks(parts.lighting, hours));
	for (const extra of parts.extra) {
		tasks.push({ bucket: bucketOf(extra.optionId), task: extra.task, hours: extra.hours });
	}
	return tasks.filter((t) => t.hours > 0);
}

export interface LaborSummary {
	totalHours: number;
	crewSize: number;
	/** Rounded up to the next half day. */
	installDays: number;
}

export function laborSummary(
	tasks: readonly LaborTask[],
	included: ReadonlySet<string>,
	stoneCrew: number,
	settings: Settings
): LaborSummary {
	const totalHours = tasks.filter((t) => included.has(t.bucket)).reduce((s, t) => s + t.hours, 0);
	const crewSize = Math.max(settings.labor.baseCrewSize, stoneCrew);
	const days = totalHours / (crewSize * settings.labor.hoursPerDay);
	return { totalHours, crewSize, installDays: Math.ceil(days * 2 - 1e-9) / 2 };
}
