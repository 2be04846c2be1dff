/**
 * Liner and underlayment: the rectangle a pond or stream bed needs, bought either by the square
 * foot or as stocked sheets. A sheet item names its size (`sheetLengthFt` × `sheetWidthFt`) and its
 * family; the smallest sheet of the family that covers the rectangle in one piece is taken, and when
 * none does, the fewest sheets that cover it seamed (then the least liner bought), with a note for
 * the crew. Pure; lengths in feet.
 */
import type { CatalogItem } from './schema';

// Seamed liner panels overlap by about 6 in under the seam tape (common practice, no source).
export const SEAM_OVERLAP_FT = 0.5;

export interface SheetNeed {
	lengthFt: number;
	widthFt: number;
}

export interface SheetFit {
	sku: string;
	/** Sheets to buy (1 when one sheet covers). */
	count: number;
	/** Area bought, ft² (the sheets' area, or the rectangle's when sold by the square foot). */
	areaFt2: number;
	seams: number;
	note?: string;
}

const isSheet = (i: CatalogItem) => i.sheetLengthFt !== undefined && i.sheetWidthFt !== undefined;

/** Panels of one sheet size along one side, each lapping the last by the seam overlap. */
export function panelsAlong(needFt: number, sheetFt: number): number {
	if (needFt <= sheetFt + 1e-9) return 1;
	const step = sheetFt - SEAM_OVERLAP_FT;
	if (step <= 0) return Infinity;
	return 1 + Math.ceil((needFt - sheetFt) / step - 1e-9);
}

function tiling(need: SheetNeed, item: CatalogItem) {
	const [a, b] = [item.sheetLengthFt!, item.sheetWidthFt!];
	const ways = [
		panelsAlong(need.lengthFt, a) * panelsAlong(need.widthFt, b),
		panelsAlong(need.lengthFt, b) * panelsAlong(need.widthFt, a)
	];
	return Math.min(...ways);
}

/**
 * The sheets for a rectangle. `chosen` is the item the design names; its family (or the item alone
 * when it has none) are the sizes considered. An item sold by the square foot is cut to size.
 */
export function fitSheets(
	need: SheetNeed,
	chosen: CatalogItem,
	items: readonly CatalogItem[],
	what: string
): SheetFit {
	const area = need.lengthFt * need.widthFt;
	if (!isSheet(chosen)) return { sku: chosen.sku, count: 1, areaFt2: area, seams: 0 };
	const family = chosen.sheetFamily
		? items.filter((i) => isSheet(i) && i.sheetFamily === chosen.sheetFamily)
		: [chosen];
	const sheetArea = (i: CatalogItem) => i.sheetLengthFt! * i.sheetWidthFt!;
	const whole = family
		.filter((i) => tiling(need, i) === 1)
		.sort((x, y) => sheetArea(x) - sheetArea(y) || x.unitPrice - y.unitPrice);
	if (whole.length) {
		return { sku: whole[0].sku, count: 1, areaFt2: sheetArea(whole[0]), seams: 0 };
	}
	const seamed = family
		.map((i) => ({ item: i, count: tiling(need, i) }))
		.filter((t) => Number.isFinite(t.count))
		.sort((x, y) => x.count - y.count || x.count * sheetArea(x.item) - y.count * sheetArea(y.item));
	const best = seamed[0] ?? { item: chosen, count: 1 };
	const size = `${need.lengthFt.toFixed(1)} × ${need.widthFt.toFixed(1)} ft`;
	return {
		sku: best.item.sku,
		count: best.count,
		areaFt2: best.count * sheetArea(best.item),
		seams: best.count - 1,
		note: `${what}: no stocked sheet covers ${size} in one piece; ${best.count} sheets of ${best.item.name} with ${best.count - 1} seam${best.count === 2 ? '' : 's'} (lap ${SEAM_OVERLAP_FT * 12} in and tape)`
	};
}
