// What every part of the builder's design form receives: the design it edits (bound), the price
// list it picks items from, and the engine's field errors by path ("design.walls.0.lengthFt").
import type { CatalogItem, ParsedCatalog, ParsedDesign } from '$lib/estimating';

export interface DesignFormProps {
	design: ParsedDesign;
	catalog: ParsedCatalog;
	err: (path: string) => string | undefined;
}

let counter = 0;
/** A fresh id for a new part of the design (unique within the page, never "base"). */
export const uid = (prefix: string) =>
	`${prefix}-${Date.now().toString(36)}${(counter++).toString(36)}${Math.floor(Math.random() * 1e4)}`;

export const itemsOf = (catalog: ParsedCatalog, category: CatalogItem['category']) =>
	catalog.items.filter((i) => i.category === category);

/** Price-list items as a select's choices: those of the categories given, or those a test keeps. */
export function choicesOf(
	catalog: ParsedCatalog,
	keep: readonly CatalogItem['category'][] | ((item: CatalogItem) => boolean)
): { value: string; label: string }[] {
	const kept =
		typeof keep === 'function'
			? catalog.items.filter(keep)
			: catalog.items.filter((i) => keep.includes(i.category));
	return kept.map((i) => ({ value: i.sku, label: i.name }));
}

/** The price list's pump models as a select's choices, each with its draw. */
export const pumpChoices = (catalog: ParsedCatalog) =>
	catalog.pumps.map((m) => ({ value: m.id, label: `${m.name} (${m.watts} W)` }));

/** For the feature at `index` of the design's list: its error-path prefix and its ids' prefix. */
export const featureKeys = (index: number) => ({ p: `design.features.${index}`, id: `f${index}` });

/** The first item whose SKU or name matches, else the first of the list. */
export function pick(items: readonly CatalogItem[], like?: RegExp): string | undefined {
	return (like && items.find((i) => like.test(i.sku) || like.test(i.name)))?.sku ?? items[0]?.sku;
}

/** The first error at a path or under it (an array's own message, then its members'). */
export function firstError(err: DesignFormProps['err'], path: string, count: number) {
	const own = err(path);
	if (own) return own;
	for (let k = 0; k < count; k++) {
		const inner = err(`${path}.${k}`);
		if (inner) return inner;
	}
	return undefined;
}

/** What the form of one feature receives: the feature (bound), its place in the design's list. */
export interface FeatureFormProps<F> {
	feature: F;
	index: number;
	catalog: ParsedCatalog;
	err: (path: string) => string | undefined;
}
