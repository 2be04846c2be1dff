// CSV for the price list: three lists, each with its own header (RFC 4180 quoting, money in
// dollars with cents, stored in cents). Nothing here writes: each file is read into a preview of
// every row with its errors, and the caller writes all rows or none.
//
//   items  one material or part a row (sku, name, category, unit, unit_cost, unit_price, …)
//   pumps  one pump model a row; its curve in one cell: "flow:head" points in US gallons per
//          hour and feet of head, separated by ";", flow rising, e.g. 0:12;600:7.4;1050:0
//   labor  one labor rate (kind "rate") or one task's hours (kind "task") a row
import { z } from 'zod';
import { catalogSchema, ITEM_UNITS, settingsSchema } from '$lib/estimating/schema';
import { CATEGORIES } from '$lib/estimating/categories';
import { HANDLING_METHODS } from '$lib/estimating/stones';
import { centsToDollarText, formatCents, parseDollars } from '$lib/components/estimates/money';
import { csvLine } from '$lib/csv';

export { CATEGORIES };

export const PRICE_LISTS = ['items', 'pumps', 'labor'] as const;
export type PriceListKind = (typeof PRICE_LISTS)[number];
export const LIST_LABELS: Record<PriceListKind, string> = {
	items: 'materials and parts',
	pumps: 'pump models',
	labor: 'labor rates and task hours'
};

export const CSV_COLUMNS = [
	'sku',
	'name',
	'category',
	'unit',
	'unit_cost',
	'unit_price',
	'taxable',
	'tags',
	'pipe_material',
	'pipe_size',
	'fitting_kind',
	'fitting_size',
	'bulk_density_lb_ft3',
	'bag_volume_ft3',
	'load_volume_yd3',
	'increment'
] as const;

export const PUMP_COLUMNS = ['pump_id', 'name', 'watts', 'price', 'cost', 'curve_gph_ft'] as const;

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

export function parseCsv(text: string): string[][] {
	const rows: string[][] = [];
	let row: string[] = [];
	let field = '';
	let quoted = false;
	const src = text.replace(/^\uFEFF/, '');
	for (let i = 0; i < src.length; i++) {
		const ch = src[i];
		if (quoted) {
			if (ch === '"' && src[i + 1] === '"') {
				field += '"';
				i++;
			} else if (ch === '"') quoted = false;
			else field += ch;
		} else if (ch === '"') quoted = true;
		else if (ch === ',') {
			row.push(field);
			field = '';
		} else if (ch === '\n' || ch === '\r') {
			if (ch === '\r' && src[i + 1] === '\n') i++;
			row.push(field);
			rows.push(row);
			row = [];
			field = '';
		} else field += ch;
	}
	if (field !== '' || row.length) {
		row.push(field);
		rows.push(row);
	}
	return rows.filter((r) => r.some((f) => f.trim() !== ''));
}

/** RFC 4180 with every cell a spreadsheet would run as a formula neutralised ($lib/csv). */
export const toCsv = (rows: readonly (readonly unknown[])[]) => rows.map(csvLine).join('');

/** The export put an apostrophe before a cell that starts like a formula; take it off again. */
const unneutralise = (cell: string) => (/^'[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell);

// ---------------------------------------------------------------------------------------------
// Rows

interface RowBase {
	line: number;
	/** The row's key: the SKU, the pump id, or kind and id for labor. */
	key: string;
	/** What the preview shows for a good row. */
	label: string;
	detail: string;
	errors: string[];
}

export interface ItemRecord {
	sku: string;
	name: string;
	category: string;
	unit: string;
	unitCostCents: number;
	unitPriceCents: number;
	taxable: boolean;
	tags: string[];
	attributes: Record<string, unknown>;
}

export interface RowResult extends RowBase {
	sku: string;
	item?: ItemRecord;
}

const itemCheck = catalogSchema.shape.items.unwrap().element;

function num(value: string, label: string, errors: string[]): number | undefined {
	if (value.trim() === '') return undefined;
	const n = Number(value);
	if (!Number.isFinite(n) || n <= 0) errors.push(`${label} must be a number above zero`);
	return n;
}

const itemRow = (line: number, sku: string, errors: string[], item?: ItemRecord): RowResult => ({
	line,
	sku,
	key: sku,
	label: item?.name ?? '',
	detail: item ? `${formatCents(item.unitPriceCents)} a ${item.unit}` : '',
	errors,
	...(item ? { item } : {})
});

/** Turns one CSV row into an item, or row-level errors; nothing is written here. */
export function rowToItem(cells: Record<string, string>, line: number): RowResult {
	const errors: string[] = [];
	const get = (k: string) => (cells[k] ?? '').trim();
	const sku = get('sku');
	if (!sku) errors.push('sku is empty');
	if (!get('name')) errors.push('name is empty');
	if (!(CATEGORIES as readonly string[]).includes(get('category'))) {
		errors.push(`category “${get('category')}” is not one of ${CATEGORIES.join(', ')}`);
	}
	if (!(ITEM_UNITS as readonly string[]).includes(get('unit'))) {
		errors.push(`unit “${get('unit')}” is not one of ${ITEM_UNITS.join(', ')}`);
	}
	const cost = parseDollars(get('unit_cost'));
	const price = parseDollars(get('unit_price'));
	if (cost === null) errors.push('unit_cost must be dollars and cents, such as 12.50');
	if (price === null) errors.push('unit_price must be dollars and cents, such as 24.00');
	const taxableText = get('taxable').toLowerCase() || 'yes';
	if (!['yes', 'no', 'true', 'false', '1', '0'].includes(taxableText)) {
		errors.push('taxable must be yes or no');
	}
	const attributes: Record<string, unknown> = {};
	if (get('pipe_material') || get('pipe_size')) {
		attributes.pipe = { material: get('pipe_material'), size: get('pipe_size') };
	}
	if (get('fitting_kind') || get('fitting_size')) {
		attributes.fitting = { kind: get('fitting_kind'), size: get('fitting_size') };
	}
	const numbers = [
		['bulk_density_lb_ft3', 'bulkDensityLbFt3'],
		['bag_volume_ft3', 'bagVolumeFt3'],
		['load_volume_yd3', 'loadVolumeYd3'],
		['increment', 'increment']
	] as const;
	for (const [col, key] of numbers) {
		const n = num(get(col), col, errors);
		if (n !== undefined) attributes[key] = n;
	}
	if (errors.length) return itemRow(line, sku, errors);
	const item: ItemRecord = {
		sku,
		name: get('name'),
		category: get('category'),
		unit: get('unit'),
		unitCostCents: cost!,
		unitPriceCents: price!,
		taxable: ['yes', 'true', '1'].includes(taxableText),
		tags: get('tags')
			.split(';')
			.map((t) => t.trim())
			.filter(Boolean),
		attributes
	};
	const check = itemCheck.safeParse(toCatalogItem(item));
	if (!check.success) {
		for (const issue of check.error.issues) {
			errors.push(`${issue.path.join('.') || 'row'}: ${issue.message}`);
		}
		return itemRow(line, sku, errors);
	}
	return itemRow(line, sku, [], item);
}

export function toCatalogItem(item: ItemRecord) {
	return {
		sku: item.sku,
		name: item.name,
		category: item.category,
		unit: item.unit,
		unitCost: item.unitCostCents,
		unitPrice: item.unitPriceCents,
		taxable: item.taxable,
		...item.attributes
	};
}

// Cells shared by the pump and labor rows, each message naming its column.

const idCell = (column: string) =>
	z
		.string()
		.trim()
		.regex(/^[a-z0-9-]{2,40}$/, `${column} must be 2 to 40 lower-case letters, digits or dashes`);

const nameCell = z.string().trim().min(1, 'name is empty').max(120, 'name is over 120 characters');

const dollarsCell = (column: string, example: string) =>
	z
		.string()
		.trim()
		.transform((text, ctx) => {
			const cents = parseDollars(text);
			if (cents !== null) return cents;
			ctx.addIssue({
				code: 'custom',
				message: text.startsWith('-')
					? `${column} must not be negative`
					: `${column} must be dollars and cents, such as ${example}`
			});
			return z.NEVER;
		});

const emptyCell = (column: string, why: string) =>
	z.string().trim().max(0, `${column} ${why}: leave it empty`);

const issues = (error: z.ZodError) => error.issues.map((i) => i.message);

// ---------------------------------------------------------------------------------------------
// Pumps

export interface PumpRecord {
	id: string;
	name: string;
	watts: number;
	priceCents: number;
	costCents: number | null;
	curve: { flowGph: number; headFt: number }[];
}

export interface PumpRowResult extends RowBase {
	pump?: PumpRecord;
}

const MAX_CURVE_POINTS = 40;

/** "flow:head;flow:head…" in gph and ft: at least two points, flow rising, head never rising. */
export const curveCell = z
	.string()
	.trim()
	.min(1, 'curve_gph_ft is empty')
	.transform((text, ctx) => {
		const fail = (message: string) => {
			ctx.addIssue({ code: 'custom', message: `curve_gph_ft: ${message}` });
			return z.NEVER;
		};
		const parts = text
			.split(';')
			.map((p) => p.trim())
			.filter(Boolean);
		if (parts.length > MAX_CURVE_POINTS) return fail(`at most ${MAX_CURVE_POINTS} points`);
		const points: { flowGph: number; headFt: number }[] = [];
		for (const [i, part] of parts.entries()) {
			const pair = part.split(':').map((n) => (n.trim() === '' ? NaN : Number(n)));
			if (pair.length !== 2 || pair.some((n) => !Number.isFinite(n))) {
				return fail(`point ${i + 1} “${part}” is not flow:head, such as 600:7.4`);
			}
			const [flowGph, headFt] = pair;
			if (flowGph < 0 || headFt < 0) return fail(`point ${i + 1} “${part}” is negative`);
			if (flowGph > 1e6 || headFt > 1e4) return fail(`point ${i + 1} “${part}” is too large`);
			const prev = points[i - 1];
			if (prev && flowGph <= prev.flowGph) {
				return fail(`point ${i + 1} “${part}”: flow must be higher than the point before`);
			}
			if (prev && headFt > prev.headFt) {
				return fail(`point ${i + 1} “${part}”: head must not be higher than the point before`);
			}
			points.push({ flowGph, headFt });
		}
		if (points.length < 2) return fail('a curve needs at least two points');
		return points;
	});

const pumpRowSchema = z.object({
	pump_id: idCell('pump_id'),
	name: nameCell,
	watts: z
		.string()
		.trim()
		.regex(/^\d{1,6}$/, 'watts must be a whole number above zero, such as 85')
		.transform(Number)
		.refine((w) => w > 0 && w <= 100_000, 'watts must be above 0 and at most 100000'),
	price: dollarsCell('price', '240.00'),
	cost: z.preprocess(
		(v) => (String(v ?? '').trim() === '' ? null : v),
		dollarsCell('cost', '130.00').nullable()
	),
	curve_gph_ft: curveCell
});

export const curveText = (curve: readonly { flowGph: number; headFt: number }[]) =>
	curve.map((p) => `${p.flowGph}:${p.headFt}`).join(';');

export function rowToPump(cells: Record<string, string>, line: number): PumpRowResult {
	const key = (cells.pump_id ?? '').trim();
	const parsed = pumpRowSchema.safeParse(cells);
	if (!parsed.success) {
		const errors = issues(parsed.error);
		return { line, key, label: '', detail: '', errors };
	}
	const r = parsed.data;
	const pump: PumpRecord = {
		id: r.pump_id,
		name: r.name,
		watts: r.watts,
		priceCents: r.price,
		costCents: r.cost,
		curve: r.curve_gph_ft
	};
	const last = pump.curve[pump.curve.length - 1];
	return {
		line,
		key,
		label: pump.name,
		detail: `${formatCents(pump.priceCents)}, ${pump.watts} W, ${pump.curve.length} points up to ${last.flowGph} gph`,
		errors: [],
		pump
	};
}

export function pumpsToCsv(pumps: readonly PumpRecord[]): string {
	return toCsv([
		PUMP_COLUMNS,
		...pumps.map((p) => [
			p.id,
			p.name,
			p.watts,
			centsToDollarText(p.priceCents),
			p.costCents === null ? '' : centsToDollarText(p.costCents),
			curveText(p.curve)
		])
	]);
}

// ---------------------------------------------------------------------------------------------
// Labor: rates and the hours each task takes (the engine's settings.labor)

type LaborHours = z.output<typeof settingsSchema>['labor'];
type HoursPath =
	readonly [keyof LaborHours] | readonly ['stoneHours', keyof LaborHours['stoneHours']];

export interface LaborTaskSpec {
	id: string;
	label: string;
	/** What one "hours" figure is per. */
	unit: string;
	path: HoursPath;
}

const STONE_TASK_LABELS: Record<(typeof HANDLING_METHODS)[number], string> = {
	'one-person': 'Set a stone one person can lift',
	'team-lift': 'Set a stone by a team lift',
	cart: 'Set a stone with a cart',
	hoist: 'Set a stone with a hoist',
	'compact-loader': 'Set a stone with a compact loader',
	'larger-machine': 'Set a stone with a larger machine'
};

export const LABOR_TASKS: readonly LaborTaskSpec[] = [
	{ id: 'basin', label: 'Dig and set the basin', unit: 'basin', path: ['basinHours'] },
	{ id: 'outlet', label: 'Plumb an outlet', unit: 'outlet', path: ['outletHours'] },
	...HANDLING_METHODS.map((m) => ({
		id: `stone-${m}`,
		label: STONE_TASK_LABELS[m],
		unit: 'stone',
		path: ['stoneHours', m] as const
	})),
	{ id: 'fixture', label: 'Set a lighting fixture', unit: 'fixture', path: ['fixtureHours'] },
	{ id: 'cable', label: 'Lay lighting cable', unit: 'ft', path: ['cableHoursPerFt'] },
	{ id: 'topping', label: 'Spread topping', unit: 'ft2', path: ['toppingHoursPerFt2'] },
	{ id: 'wall-unit', label: 'Lay a wall unit', unit: 'wall unit', path: ['wallHoursPerUnit'] },
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

/** Task hours read out of the engine's settings (defaults filled in). */
export function taskHours(engine: unknown): { spec: LaborTaskSpec; hours: number }[] {
	const labor = settingsSchema.parse(engine ?? {}).labor;
	return LABOR_TASKS.map((spec) => ({
		spec,
		hours: spec.path.length === 1 ? (labor[spec.path[0]] as number) : labor.stoneHours[spec.path[1]]
	}));
}

/** The engine's settings with the imported task hours and default rate written in. */
export function withLabor(engine: Record<string, unknown>, records: readonly LaborRecord[]) {
	const labor = { ...((engine.labor as Record<string, unknown> | undefined) ?? {}) };
	const stoneHours = { ...((labor.stoneHours as Record<string, unknown> | undefined) ?? {}) };
	for (const r of records) {
		if (r.kind === 'rate' && r.isDefault) labor.rateId = r.rate.id;
		if (r.kind !== 'task') continue;
		const path = taskSpec(r.taskId)!.path;
		if (path.length === 1) labor[path[0]] = r.hours;
		else stoneHours[path[1]] = r.hours;
	}
	if (Object.keys(stoneHours).length) labor.stoneHours = stoneHours;
	return { ...engine, labor };
}

export function laborToCsv(rates: readonly LaborRateRecord[], engine: unknown): string {
	const wanted = settingsSchema.parse(engine ?? {}).labor.rateId;
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

// ---------------------------------------------------------------------------------------------
// The preview: which list, the header, every row

interface ListSpec<R extends RowBase> {
	columns: readonly string[];
	required: readonly string[];
	keyColumn: string;
	noun: string;
	parseRow(cells: Record<string, string>, line: number): R;
}

const LISTS = {
	items: {
		columns: CSV_COLUMNS,
		required: ['sku', 'name', 'category', 'unit', 'unit_cost', 'unit_price'],
		keyColumn: 'sku',
		noun: 'items',
		parseRow: rowToItem
	} satisfies ListSpec<RowResult>,
	pumps: {
		columns: PUMP_COLUMNS,
		required: ['pump_id', 'name', 'watts', 'price', 'curve_gph_ft'],
		keyColumn: 'pump_id',
		noun: 'pumps',
		parseRow: rowToPump
	} satisfies ListSpec<PumpRowResult>,
	labor: {
		columns: LABOR_COLUMNS,
		required: ['kind', 'labor_id', 'name'],
		keyColumn: 'labor_id',
		noun: 'rows',
		parseRow: rowToLabor
	} satisfies ListSpec<LaborRowResult>
};

interface PreviewOf<K, R> {
	list: K;
	rows: R[];
	headerErrors: string[];
	ok: boolean;
}
export type ItemsPreview = PreviewOf<'items', RowResult>;
export type PumpsPreview = PreviewOf<'pumps', PumpRowResult>;
export type LaborPreview = PreviewOf<'labor', LaborRowResult>;
/** `list: null`: the header fits none of the lists and none was chosen. */
export type CsvPreview = ItemsPreview | PumpsPreview | LaborPreview | PreviewOf<null, RowBase>;

/** Which list a header row belongs to, from the column only that list has. */
export function detectList(header: readonly string[]): PriceListKind | null {
	const h = header.map((c) => c.trim().toLowerCase());
	if (h.includes('sku')) return 'items';
	if (h.includes('pump_id') || h.includes('curve_gph_ft')) return 'pumps';
	if (h.includes('labor_id')) return 'labor';
	return null;
}

function headerErrorsFor(header: string[], spec: ListSpec<RowBase>) {
	const missing = spec.required.filter((c) => !header.includes(c));
	const unknown = header.filter((h) => !spec.columns.includes(h));
	const twice = header.filter((h, i) => h && header.indexOf(h) !== i);
	return [
		...missing.map((c) => `Column “${c}” is missing`),
		...unknown.map((c) => `Column “${c}” is not one we read`),
		...[...new Set(twice)].map((c) => `Column “${c}” appears twice`)
	];
}

function markDuplicates(rows: RowBase[], keyColumn: string) {
	const seen = new Map<string, number>();
	for (const r of rows) {
		if (!r.key.trim()) continue;
		const first = seen.get(r.key);
		const shown = keyColumn === 'labor_id' ? r.key : `${keyColumn} ${r.key}`;
		if (first !== undefined) r.errors.push(`${shown} also appears on line ${first}`);
		else seen.set(r.key, r.line);
	}
}

/** Only one rate can price the labor. */
function markDefaultRates(rows: LaborRowResult[]) {
	const defaults = rows.filter((r) => r.labor?.kind === 'rate' && r.labor.isDefault);
	for (const r of defaults.slice(1)) {
		r.errors.push(`default_rate: line ${defaults[0].line} is already the default rate`);
	}
}

function previewList<K extends PriceListKind>(
	list: K,
	table: string[][],
	detected: PriceListKind | null
) {
	const spec = LISTS[list] as unknown as ListSpec<RowBase>;
	const header = table[0].map((h) => h.trim().toLowerCase());
	const headerErrors = headerErrorsFor(header, spec);
	if (detected && detected !== list) {
		headerErrors.unshift(
			`This header looks like the ${LIST_LABELS[detected]} list, not the ${LIST_LABELS[list]}`
		);
	}
	const rows = table.slice(1).map((cells, i) => {
		const record: Record<string, string> = Object.fromEntries(spec.columns.map((c) => [c, '']));
		header.forEach((h, j) => (record[h] = unneutralise(cells[j] ?? '')));
		return spec.parseRow(record, i + 2);
	});
	markDuplicates(rows, spec.keyColumn);
	if (list === 'labor') markDefaultRates(rows as LaborRowResult[]);
	if (rows.length === 0) headerErrors.push(`The file has a header but no ${spec.noun}`);
	const ok = headerErrors.length === 0 && rows.every((r) => r.errors.length === 0);
	return { list, rows, headerErrors, ok };
}

/**
 * Reads a file as the chosen list, or as the list its header names ('auto'); every row comes
 * back with its errors, and `ok` only when nothing is wrong anywhere.
 */
export function previewPriceList(
	text: string,
	choice: PriceListKind | 'auto' = 'auto'
): CsvPreview {
	const table = parseCsv(text);
	if (table.length === 0) {
		return { list: null, rows: [], headerErrors: ['The file is empty'], ok: false };
	}
	const detected = detectList(table[0]);
	const list = choice === 'auto' ? detected : choice;
	if (!list) {
		return {
			list: null,
			rows: [],
			headerErrors: [
				'Which list is this? Its header has none of sku (materials and parts), pump_id (pumps) or labor_id (labor): choose the list'
			],
			ok: false
		};
	}
	return previewList(list, table, detected) as CsvPreview;
}

/** The items list alone (the import's first format; kept for callers that only read items). */
export function previewCsv(text: string): ItemsPreview {
	const table = parseCsv(text);
	if (table.length === 0) {
		return { list: 'items', rows: [], headerErrors: ['The file is empty'], ok: false };
	}
	return previewList('items', table, null) as ItemsPreview;
}

export function itemsToCsv(items: ItemRecord[]): string {
	const rows = items.map((i) => {
		const a = i.attributes as {
			pipe?: { material: string; size: string };
			fitting?: { kind: string; size: string };
			bulkDensityLbFt3?: number;
			bagVolumeFt3?: number;
			loadVolumeYd3?: number;
			increment?: number;
		};
		return [
			i.sku,
			i.name,
			i.category,
			i.unit,
			centsToDollarText(i.unitCostCents),
			centsToDollarText(i.unitPriceCents),
			i.taxable ? 'yes' : 'no',
			i.tags.join(';'),
			a.pipe?.material ?? '',
			a.pipe?.size ?? '',
			a.fitting?.kind ?? '',
			a.fitting?.size ?? '',
			String(a.bulkDensityLbFt3 ?? ''),
			String(a.bagVolumeFt3 ?? ''),
			String(a.loadVolumeYd3 ?? ''),
			String(a.increment ?? '')
		];
	});
	return toCsv([[...CSV_COLUMNS], ...rows]);
}

export const csvTextSchema = z.string().max(2_000_000, 'The file is larger than 2 MB');

export const listChoiceSchema = z.enum([...PRICE_LISTS, 'auto'], {
	message: 'Choose materials and parts, pumps or labor'
});
