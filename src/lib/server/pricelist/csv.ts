// CSV for the price list: three lists, each with its own header (RFC 4180 quoting, money in
// dollars with cents, stored in cents). Nothing here writes: each file is read into a preview of
// every row with its errors, and the caller writes all rows or none.
//
//   items  one material or part a row (sku, name, category, unit, unit_cost, unit_price, …)
//   pumps  one pump model a row; its curve in one cell: "flow:head" points in US gallons per
//          hour and feet of head, separated by ";", flow rising, e.g. 0:12;600:7.4;1050:0
//   labor  one labor rate (kind "rate") or one task's hours (kind "task") a row
import { z } from 'zod';
import { catalogSchema, ITEM_UNITS } from '$lib/estimating/schema';
import { CATEGORIES } from '$lib/estimating/categories';
import { centsToDollarText, formatCents, parseCents } from '$lib/money';
import { parseCsv, PRICE_DIGITS, toCsv, unneutralise, type RowBase } from './csv-cells';
import { PUMP_COLUMNS, rowToPump, type PumpRowResult } from './csv-pumps';
import { LABOR_COLUMNS, rowToLabor, type LaborRowResult } from './csv-labor';

export { CATEGORIES };
export { parseCsv, toCsv } from './csv-cells';
export * from './csv-pumps';
export * from './csv-labor';

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
	'increment',
	'sheet_length_ft',
	'sheet_width_ft',
	'sheet_family',
	'rated_flow_gph',
	'rated_volume_gal'
] as const;

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
	const cost = parseCents(get('unit_cost'), PRICE_DIGITS);
	const price = parseCents(get('unit_price'), PRICE_DIGITS);
	const money = (col: string, example: string) =>
		get(col).startsWith('-')
			? `${col} must not be negative`
			: `${col} must be dollars and cents, such as ${example}`;
	if (cost === null) errors.push(money('unit_cost', '12.50'));
	if (price === null) errors.push(money('unit_price', '24.00'));
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
		['increment', 'increment'],
		['sheet_length_ft', 'sheetLengthFt'],
		['sheet_width_ft', 'sheetWidthFt'],
		['rated_flow_gph', 'ratedFlowGph'],
		['rated_volume_gal', 'ratedVolumeGal']
	] as const;
	for (const [col, key] of numbers) {
		const n = num(get(col), col, errors);
		if (n !== undefined) attributes[key] = n;
	}
	if (get('sheet_family')) attributes.sheetFamily = get('sheet_family');
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
			sheetLengthFt?: number;
			sheetWidthFt?: number;
			sheetFamily?: string;
			ratedFlowGph?: number;
			ratedVolumeGal?: number;
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
			String(a.increment ?? ''),
			String(a.sheetLengthFt ?? ''),
			String(a.sheetWidthFt ?? ''),
			a.sheetFamily ?? '',
			String(a.ratedFlowGph ?? ''),
			String(a.ratedVolumeGal ?? '')
		];
	});
	return toCsv([[...CSV_COLUMNS], ...rows]);
}

export const csvTextSchema = z.string().max(2_000_000, 'The file is larger than 2 MB');

export const listChoiceSchema = z.enum([...PRICE_LISTS, 'auto'], {
	message: 'Choose materials and parts, pumps or labor'
});
