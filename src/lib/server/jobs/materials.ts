// A job's materials, crew size and kind, read from the stored engine result.
import type { FrozenEstimate } from '../platform/db/schema';

// ---------------------------------------------------------------------------------------------
// The engine result, read defensively (it is stored as jsonb)

interface StoredLine {
	bucket?: string;
	sku?: string;
	name?: string;
	description?: string;
	unit?: string;
	quantity?: number;
}

function resultLines(result: Record<string, unknown>): StoredLine[] {
	const pricing = result.pricing as { lines?: StoredLine[] } | undefined;
	return Array.isArray(pricing?.lines) ? pricing.lines : [];
}

/** The buckets the homeowner bought: the base, the options chosen, the alternates picked. */
export function includedBuckets(choices: FrozenEstimate['choices']): Set<string> {
	return new Set(['base', ...choices.options, ...Object.values(choices.alternates)]);
}

export function crewNeededFrom(result: Record<string, unknown>): number {
	const stones = result.stones as { crewNeeded?: number } | undefined;
	const n = Number(stones?.crewNeeded ?? 0);
	return Number.isFinite(n) && n > 0 ? Math.round(n) : 0;
}

export function isWaterFeature(result: Record<string, unknown>): boolean {
	const systems = result.systems;
	return (
		Boolean(result.water) || Boolean(result.basin) || (Array.isArray(systems) && systems.length > 0)
	);
}

const CATEGORY_ORDER = [
	'stone',
	'basin',
	'liner',
	'filtration',
	'pump',
	'pipe',
	'fitting',
	'valve',
	'aggregate',
	'wall',
	'lighting',
	'electrical',
	'other'
];

/** The materials list from the takeoff lines of the buckets bought, grouped by category. */
export function materialsFromResult(
	result: Record<string, unknown>,
	catalog: Record<string, unknown> | null,
	choices: FrozenEstimate['choices']
) {
	const items = Array.isArray(catalog?.items)
		? (catalog.items as { sku: string; category: string }[])
		: [];
	const categoryOf = new Map(items.map((i) => [i.sku, i.category]));
	const included = includedBuckets(choices);
	const rows = resultLines(result)
		.filter((l) => included.has(l.bucket ?? 'base') && Number(l.quantity) > 0)
		.map((l) => ({
			category: l.sku?.startsWith('pump:') ? 'pump' : (categoryOf.get(l.sku ?? '') ?? 'other'),
			sku: l.sku ?? '',
			name: l.name ?? l.description ?? 'Item',
			description: l.description ?? '',
			unit: l.unit ?? 'each',
			quantity: Number(l.quantity)
		}));
	const rank = (c: string) => {
		const i = CATEGORY_ORDER.indexOf(c);
		return i === -1 ? CATEGORY_ORDER.length : i;
	};
	return rows
		.sort((a, b) => rank(a.category) - rank(b.category) || a.name.localeCompare(b.name))
		.map((r, i) => ({ ...r, sortOrder: i }));
}
