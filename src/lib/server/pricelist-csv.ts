// CSV for the price list: RFC 4180 quoting, one item per row, money in dollars with cents.
import { z } from 'zod';
import { catalogSchema, ITEM_UNITS } from '$lib/estimating/schema';
import { CATEGORIES } from '$lib/estimating/categories';
import { centsToDollarText, parseDollars } from '$lib/components/estimates/money';

export { CATEGORIES };

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

const quote = (v: string) => (/[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);
export const toCsv = (rows: string[][]) =>
	rows.map((r) => r.map(quote).join(',')).join('\r\n') + '\r\n';

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

export interface RowResult {
	line: number;
	sku: string;
	item?: ItemRecord;
	errors: string[];
}

const itemCheck = catalogSchema.shape.items.unwrap().element;

function num(value: string, label: string, errors: string[]): number | undefined {
	if (value.trim() === '') return undefined;
	const n = Number(value);
	if (!Number.isFinite(n) || n <= 0) errors.push(`${label} must be a number above zero`);
	return n;
}

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
	if (errors.length) return { line, sku, errors };
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
		return { line, sku, errors };
	}
	return { line, sku, item, errors: [] };
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

export interface CsvPreview {
	rows: RowResult[];
	headerErrors: string[];
	ok: boolean;
}

export function previewCsv(text: string): CsvPreview {
	const table = parseCsv(text);
	if (table.length === 0) return { rows: [], headerErrors: ['The file is empty'], ok: false };
	const header = table[0].map((h) => h.trim().toLowerCase());
	const missing = ['sku', 'name', 'category', 'unit', 'unit_cost', 'unit_price'].filter(
		(c) => !header.includes(c)
	);
	const unknown = header.filter((h) => !(CSV_COLUMNS as readonly string[]).includes(h));
	const headerErrors = [
		...missing.map((c) => `Column “${c}” is missing`),
		...unknown.map((c) => `Column “${c}” is not one we read`)
	];
	const rows = table.slice(1).map((cells, i) => {
		const record = Object.fromEntries(header.map((h, j) => [h, cells[j] ?? '']));
		return rowToItem(record, i + 2);
	});
	const seen = new Map<string, number>();
	for (const r of rows) {
		if (!r.sku) continue;
		const first = seen.get(r.sku);
		if (first !== undefined) r.errors.push(`sku ${r.sku} also appears on line ${first}`);
		else seen.set(r.sku, r.line);
	}
	if (rows.length === 0) headerErrors.push('The file has a header but no items');
	const ok = headerErrors.length === 0 && rows.every((r) => r.errors.length === 0);
	return { rows, headerErrors, ok };
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
