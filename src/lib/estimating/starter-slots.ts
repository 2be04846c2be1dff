// A part of the starting design and the way an item is picked for it: shared by the starting
// feature (starter.ts) and the starting parts of ponds and streams (starter-features.ts).
import type { CATEGORIES } from './categories';
import type { Measure } from './pricing';
import type { CatalogItem } from './schema';

export interface Slot {
	category: (typeof CATEGORIES)[number];
	/** What the takeoff measures for this part: an item must be able to price it. */
	measure: Measure;
	/** Names that fit the part best (preferred, or required when `strict`). */
	hint?: RegExp;
	strict?: boolean;
	/** Names that must not be picked for this part (a cap is not a wall unit). */
	exclude?: RegExp;
}

export type Pick = (slot: Slot, templateSku: string | undefined) => CatalogItem | undefined;
