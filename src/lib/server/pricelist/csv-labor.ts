// Labor in CSV: one labor rate (kind "rate") or the hours one task takes (kind "task", the
// engine's settings.labor) a row.
import { z } from 'zod';
import { settingsSchema } from '$lib/estimating/schema';
import { LABOR_RATES, type LaborRateKey } from '$lib/estimating/labor-rates';
import { centsToDollarText, formatCents } from '$lib/money';
import { dollarsCell, emptyCell, idCell, issues, nameCell, toCsv, type RowBase } from './csv-cells';

export const LABOR_COLUMNS = [
	'kind',
	'labor_id',
	'name',
	'unit',
	'hours',
	'cost_per_hour',
	'price_per_hour',
	'default_rate'
] as const;

type LaborSettings = z.output<typeof settingsSchema>['labor'];
type HoursPath = readonly ['rates', LaborRateKey] | readonly ['hoursPerDay'];

export interface LaborTaskSpec {
	id: string;
	label: string;
	/** What one "hours" figure is per. */
	unit: string;
	path: HoursPath;
}

// Every rate of the engine's list, by its own key, then the crew day.
export const LABOR_TASKS: readonly LaborTaskSpec[] = [
	...LABOR_RATES.map((r) => ({
		id: r.key,
		label: r.label,
		unit: r.unit,
		path: ['rates', r.key] as const
	})),
	{ id: 'crew-day', label: 'Working hours in a crew day', unit: 'day', path: ['hoursPerDay'] }
];
export const LABOR_TASK_UNITS = [...new Set(LABOR_TASKS.map((t) => t.unit))];

export interface LaborRateRecord {
	id: string;
	name: string;
	costPerHourCents: number;
	pricePerHourCents: number;
}

export type LaborRecord =
	| { kind: 'rate'; rate: LaborRateRecord; isDefault: boolean }
	| { kind: 'task'; taskId: string; hours: number };

export interface LaborRowResult extends RowBase {
	labor?: LaborRecord;
}

const yesNoCell = z
	.string()
	.trim()
	.toLowerCase()
	.refine((v) => ['', 'yes', 'no'].includes(v), 'default_rate must be yes, no or empty')
	.transform((v) => v === 'yes');

const rateRowSchema = z.object({
	labor_id: idCell('labor_id'),
	name: nameCell,
	unit: emptyCell('unit', 'is for task rows'),
	hours: emptyCell('hours', 'is for task rows'),
	cost_per_hour: dollarsCell('cost_per_hour', '38.00'),
	price_per_hour: dollarsCell('price_per_hour', '85.00'),
	default_rate: yesNoCell
});

const taskRowSchema = z.object({
	labor_id: z
		.string()
		.trim()
		.superRefine((id, ctx) => {
			if (taskSpec(id)) return;
			const known = LABOR_TASKS.map((t) => t.id).join(', ');
			ctx.addIssue({ code: 'custom', message: `labor_id “${id}” is not a task we time: ${known}` });
		}),
	unit: z.string().trim(),
	hours: z
		.string()
		.trim()
		.min(1, 'hours is empty')
		.transform(Number)
		.refine((h) => Number.isFinite(h), 'hours must be a number, such as 1.5')
		.refine((h) => h >= 0, 'hours must not be negative')
		.refine((h) => h <= 1000, 'hours must be at most 1000'),
	cost_per_hour: emptyCell('cost_per_hour', 'is for rate rows'),
	price_per_hour: emptyCell('price_per_hour', 'is for rate rows'),
	default_rate: emptyCell('default_rate', 'is for rate rows')
});

const taskSpec = (id: string) => LABOR_TASKS.find((t) => t.id === id);

function rateRow(cells: Record<string, string>, line: number, key: string): LaborRowResult {
	const parsed = rateRowSchema.safeParse(cells);
	if (!parsed.success) return { line, key, label: '', detail: '', errors: issues(parsed.error) };
	const r = parsed.data;
	const rate = {
		id: r.labor_id,
		name: r.name,
		costPerHourCents: r.cost_per_hour,
		pricePerHourCents: r.price_per_hour
	};
	return {
		line,
		key,
		label: rate.name,
		detail: `${formatCents(rate.pricePerHourCents)} an hour${r.default_rate ? ', prices the labor' : ''}`,
		errors: [],
		labor: { kind: 'rate', rate, isDefault: r.default_rate }
	};
}

function taskRow(cells: Record<string, string>, line: number, key: string): LaborRowResult {
	const parsed = taskRowSchema.safeParse(cells);
	const errors = parsed.success ? [] : issues(parsed.error);
	const spec = taskSpec((cells.labor_id ?? '').trim());
	const unit = (cells.unit ?? '').trim();
	if (spec && unit && unit !== spec.unit) {
		errors.push(`unit “${unit}” is not this task's unit: its hours are per ${spec.unit}`);
	}
	if (!parsed.success || !spec || errors.length) {
		return { line, key, label: '', detail: '', errors };
	}
	const hours = parsed.data.hours;
	if (spec.id === 'crew-day' && (hours <= 0 || hours > 24)) {
		return { line, key, label: '', detail: '', errors: ['hours of a crew day must be 0 to 24'] };
	}
	return {
		line,
		key,
		label: spec.label,
		detail: `${hours} h per ${spec.unit}`,
		errors: [],
		labor: { kind: 'task', taskId: spec.id, hours }
	};
}

export function rowToLabor(cells: Record<string, string>, line: number): LaborRowResult {
	const kind = (cells.kind ?? '').trim().toLowerCase();
	const key = `${kind} ${(cells.labor_id ?? '').trim()}`;
	if (kind === 'rate') return rateRow(cells, line, key);
	if (kind === 'task') return taskRow(cells, line, key);
	return { line, key, label: '', detail: '', errors: [`kind “${kind}” must be rate or task`] };
}

/** The engine's labor settings with defaults filled in (the defaults alone if the row is unreadable). */
function laborSettings(engine: unknown): LaborSettings {
	const parsed = settingsSchema.safeParse(engine ?? {});
	return (parsed.success ? parsed.data : settingsSchema.parse({})).labor;
}

/** Task hours read out of the engine's settings (defaults filled in). */
export function taskHours(engine: unknown): { spec: LaborTaskSpec; hours: number }[] {
	const labor = laborSettings(engine);
	return LABOR_TASKS.map((spec) => ({
		spec,
		hours: spec.path[0] === 'rates' ? labor.rates[spec.path[1]] : labor.hoursPerDay
	}));
}

/** The engine's settings with the imported task hours and default rate written in. */
export function withLabor(engine: Record<string, unknown>, records: readonly LaborRecord[]) {
	const labor = { ...((engine.labor as Record<string, unknown> | undefined) ?? {}) };
	const rates = { ...((labor.rates as Record<string, unknown> | undefined) ?? {}) };
	for (const r of records) {
		if (r.kind === 'rate' && r.isDefault) labor.rateId = r.rate.id;
		if (r.kind !== 'task') continue;
		const path = taskSpec(r.taskId)!.path;
		if (path[0] === 'rates') rates[path[1]] = r.hours;
		else labor.hoursPerDay = r.hours;
	}
	if (Object.keys(rates).length) labor.rates = rates;
	return { ...engine, labor };
}

export function laborToCsv(rates: readonly LaborRateRecord[], engine: unknown): string {
	const wanted = laborSettings(engine).rateId;
	const defaultId = rates.find((r) => r.id === wanted)?.id ?? rates[0]?.id;
	return toCsv([
		LABOR_COLUMNS,
		...rates.map((r) => [
			'rate',
			r.id,
			r.name,
			'',
			'',
			centsToDollarText(r.costPerHourCents),
			centsToDollarText(r.pricePerHourCents),
			r.id === defaultId ? 'yes' : 'no'
		]),
		...taskHours(engine).map(({ spec, hours }) => [
			'task',
			spec.id,
			spec.label,
			spec.unit,
			hours,
			'',
			'',
			''
		])
	]);
}
