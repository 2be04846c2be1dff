/**
 * Hand edits on top of the engine's priced lines. An override replaces a computed line's quantity
 * or unit price and keeps the computed values beside it with a reason; an added line is a line the
 * estimator typed in. The totals are then summed again with the engine's own pricing rules
 * (`priceSummary`), so the rounding rule in pricing.ts holds for edited estimates too.
 */
import { BASE_BUCKET } from './labor';
import {
	percentOf,
	pickLaborRate,
	priceSummary,
	roundCents,
	type PriceSummary,
	type PricedLine
} from './pricing';
import { readCatalog } from './prepared';
import { designSchema, ITEM_UNITS, type ItemUnit } from './schema';
import { upgradeDesign } from './upgrade';
import type { EstimateSuccess } from './index';

export interface LineOverride {
	/** `lineKey()` of the computed line, or a fresh id for an added line. */
	key: string;
	kind: 'override' | 'added';
	bucket: string;
	description: string;
	unit: ItemUnit;
	quantity: number;
	unitPriceCents: number;
	unitCostCents: number;
	taxable: boolean;
	/** The engine's values when the line was overridden. */
	computed?: { quantity: number; unitPriceCents: number };
	reason: string;
}

export interface ShownLine extends PricedLine {
	key: string;
	override?: LineOverride;
}

export const lineKey = (l: Pick<PricedLine, 'bucket' | 'sku' | 'description'>) =>
	`${l.bucket}|${l.sku}|${l.description}`;

export const UNITS: readonly ItemUnit[] = ITEM_UNITS;

function edited(line: PricedLine, o: LineOverride, costPerUnit: number): ShownLine {
	return {
		...line,
		key: lineKey(line),
		quantity: o.quantity,
		unitPriceCents: o.unitPriceCents,
		extendedCents: roundCents(o.quantity * o.unitPriceCents),
		costCents: roundCents(o.quantity * costPerUnit),
		override: o
	};
}

/** The computed lines with overrides applied and added lines appended. */
export function shownLines(lines: readonly PricedLine[], overrides: readonly LineOverride[]) {
	const byKey = new Map(overrides.filter((o) => o.kind === 'override').map((o) => [o.key, o]));
	const shown: ShownLine[] = lines.map((line) => {
		const o = byKey.get(lineKey(line));
		if (!o) return { ...line, key: lineKey(line) };
		const costPerUnit = line.quantity > 0 ? line.costCents / line.quantity : o.unitCostCents;
		return edited(line, o, costPerUnit);
	});
	for (const o of overrides.filter((x) => x.kind === 'added')) {
		shown.push({
			bucket: o.bucket || BASE_BUCKET,
			sku: `HAND-${o.key}`,
			name: o.description,
			description: o.description,
			unit: o.unit,
			quantity: o.quantity,
			unitPriceCents: o.unitPriceCents,
			extendedCents: roundCents(o.quantity * o.unitPriceCents),
			costCents: roundCents(o.quantity * o.unitCostCents),
			taxable: o.taxable,
			key: o.key,
			override: o
		});
	}
	return shown;
}

/** Overrides whose computed line no longer exists (the design changed under them). */
export function staleOverrides(lines: readonly PricedLine[], overrides: readonly LineOverride[]) {
	const keys = new Set(lines.map(lineKey));
	return overrides.filter((o) => o.kind === 'override' && !keys.has(o.key));
}

export interface PricedEstimate {
	lines: ShownLine[];
	pricing: PriceSummary;
	depositPercent: number;
}

/** Prices the engine's result again with the overrides: same rules, same rounding. */
export function priceWithOverrides(
	result: EstimateSuccess,
	design: unknown,
	catalog: unknown,
	overrides: readonly LineOverride[]
): PricedEstimate {
	const d = designSchema.parse(upgradeDesign(design));
	const read = readCatalog(catalog);
	if (!read.success) throw read.error;
	const c = read.data;
	const lines = shownLines(result.pricing.lines, overrides);
	const pricing = priceSummary(d, lines, result.labor.tasks, pickLaborRate(c), c.settings);
	return { lines, pricing: { ...pricing, lines }, depositPercent: c.settings.depositPercent };
}

export interface Choices {
	options: string[];
	alternates: Record<string, string>;
}

export interface ChoiceTotals {
	totalCents: number;
	taxCents: number;
	depositCents: number;
	balanceCents: number;
}

/**
 * The total for a homeowner's choices from the stored price summary: the same sum priceSummary
 * makes (base plus each chosen option plus each alternate's chosen choice), deposit by percentOf.
 * Unknown ids are ignored; an alternate with no valid choice keeps the estimator's choice.
 */
export function totalsForChoices(
	pricing: PriceSummary,
	choices: Choices,
	depositPercent: number
): ChoiceTotals {
	const picked = [pricing.base];
	for (const o of pricing.options) if (choices.options.includes(o.id)) picked.push(o.totals);
	for (const a of pricing.alternates) {
		const wanted = a.choices.find((c) => c.id === choices.alternates[a.id]);
		const chosen = wanted ?? a.choices.find((c) => c.id === a.selectedChoiceId);
		if (chosen) picked.push(chosen.totals);
	}
	const totalCents = picked.reduce((s, t) => s + t.totalCents, 0);
	const taxCents = picked.reduce((s, t) => s + t.taxCents, 0);
	const depositCents = percentOf(totalCents, depositPercent);
	return { totalCents, taxCents, depositCents, balanceCents: totalCents - depositCents };
}

/** Only ids that exist in the estimate; each alternate gets exactly one valid choice. */
export function cleanChoices(pricing: PriceSummary, choices: Partial<Choices>): Choices {
	const options = pricing.options
		.map((o) => o.id)
		.filter((id) => (choices.options ?? []).includes(id));
	const alternates: Record<string, string> = {};
	for (const a of pricing.alternates) {
		const wanted = choices.alternates?.[a.id];
		alternates[a.id] = a.choices.some((c) => c.id === wanted) ? wanted! : a.selectedChoiceId;
	}
	return { options, alternates };
}

export const defaultChoices = (pricing: PriceSummary): Choices => ({
	options: pricing.options.filter((o) => o.selected).map((o) => o.id),
	alternates: Object.fromEntries(pricing.alternates.map((a) => [a.id, a.selectedChoiceId]))
});
