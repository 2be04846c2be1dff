/**
 * Pricing in integer cents.
 *
 * THE ROUNDING RULE: every money amount the engine computes (a line's extension, a labor line,
 * a markup, a tax, the deposit, a running cost) is rounded once, to the nearest whole cent with
 * halves rounded up, at the moment it is computed. Every total is a plain sum of amounts already
 * rounded, so the lines always add up exactly to the totals shown.
 */
import { BASE_BUCKET, type LaborTask } from './labor';
import type { CatalogItem, ItemUnit, ParsedCatalog, ParsedDesign, Settings } from './schema';
import { fromSI, toSI } from './units';

/** Round half up to a whole cent; the 1e-7 guards against binary fractions such as 1.005 × 100. */
export function roundCents(amount: number): number {
	return Math.floor(amount + 0.5 + 1e-7);
}

export const percentOf = (cents: number, percent: number) => roundCents((cents * percent) / 100);

/** What a takeoff line needs, in SI; the item's unit decides which one is used. */
export interface Measure {
	count?: number;
	lengthM?: number;
	areaM2?: number;
	volumeM3?: number;
	massKg?: number;
	/** Already in the item's own unit (extra lines). */
	direct?: number;
}

export interface TakeoffLine {
	bucket: string;
	/** The feature the line belongs to (a pond, a stream, a fountain); none for shared parts. */
	feature?: string;
	sku: string;
	description: string;
	measure: Measure;
}

// Whole purchase units by default; bulk tons and cubic yards in tenths.
const DEFAULT_INCREMENT: Record<ItemUnit, number> = {
	each: 1,
	ft: 1,
	ft2: 1,
	ft3: 1,
	yd3: 0.1,
	ton: 0.1,
	lb: 1,
	bag: 1,
	load: 1,
	day: 1
};

function massFrom(measure: Measure, item: CatalogItem): number | undefined {
	if (measure.massKg !== undefined) return measure.massKg;
	if (measure.volumeM3 === undefined || item.bulkDensityLbFt3 === undefined) return undefined;
	return measure.volumeM3 * toSI(item.bulkDensityLbFt3, 'density', 'lb/ft3');
}

/** The quantity in the item's unit, before rounding up to its purchase increment. */
export function quantityInUnit(measure: Measure, item: CatalogItem): number | undefined {
	if (measure.direct !== undefined) return measure.direct;
	const volume = measure.volumeM3;
	switch (item.unit) {
		case 'each':
			return measure.count;
		case 'ft':
			return measure.lengthM === undefined ? undefined : fromSI(measure.lengthM, 'length', 'ft');
		case 'ft2':
			return measure.areaM2 === undefined ? undefined : fromSI(measure.areaM2, 'area', 'ft2');
		case 'ft3':
		case 'yd3':
			return volume === undefined ? undefined : fromSI(volume, 'volume', item.unit);
		case 'ton':
		case 'lb': {
			const mass = massFrom(measure, item);
			return mass === undefined ? undefined : fromSI(mass, 'mass', item.unit);
		}
		case 'bag':
			if (volume === undefined || !item.bagVolumeFt3) return undefined;
			return fromSI(volume, 'volume', 'ft3') / item.bagVolumeFt3;
		case 'day':
			return measure.count;
		case 'load':
			if (volume === undefined || !item.loadVolumeYd3) return undefined;
			return fromSI(volume, 'volume', 'yd3') / item.loadVolumeYd3;
	}
}

export function purchaseQuantity(quantity: number, item: CatalogItem): number {
	const step = item.increment ?? DEFAULT_INCREMENT[item.unit];
	const steps = Math.ceil(quantity / step - 1e-9);
	return Number((Math.max(0, steps) * step).toFixed(6));
}

export interface PricedLine {
	bucket: string;
	feature?: string;
	sku: string;
	name: string;
	description: string;
	unit: ItemUnit;
	quantity: number;
	unitPriceCents: number;
	extendedCents: number;
	costCents: number;
	taxable: boolean;
}

export function priceLine(line: TakeoffLine, item: CatalogItem, quantity: number): PricedLine {
	const purchased = purchaseQuantity(quantity, item);
	return {
		bucket: line.bucket,
		...(line.feature ? { feature: line.feature } : {}),
		sku: item.sku,
		name: item.name,
		description: line.description,
		unit: item.unit,
		quantity: purchased,
		unitPriceCents: item.unitPrice,
		extendedCents: roundCents(purchased * item.unitPrice),
		costCents: roundCents(purchased * item.unitCost),
		taxable: item.taxable
	};
}

export interface BucketTotals {
	materialsCents: number;
	laborHours: number;
	laborCents: number;
	subtotalCents: number;
	markupCents: number;
	taxCents: number;
	totalCents: number;
	costCents: number;
}

export interface LaborRate {
	costPerHourCents: number;
	pricePerHourCents: number;
}

export function bucketTotals(
	lines: readonly PricedLine[],
	tasks: readonly LaborTask[],
	rate: LaborRate,
	settings: Settings
): BucketTotals {
	const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
	const materialsCents = sum(lines.map((l) => l.extendedCents));
	const laborHours = sum(tasks.map((t) => t.hours));
	const laborCents = roundCents(laborHours * rate.pricePerHourCents);
	const subtotalCents = materialsCents + laborCents;
	const markupCents = percentOf(subtotalCents, settings.markupPercent);
	const taxableCents =
		settings.taxAppliesTo === 'all'
			? subtotalCents
			: sum(lines.filter((l) => l.taxable).map((l) => l.extendedCents));
	const taxBase = taxableCents * (1 + settings.markupPercent / 100);
	const taxCents = roundCents((taxBase * settings.taxRatePercent) / 100);
	return {
		materialsCents,
		laborHours,
		laborCents,
		subtotalCents,
		markupCents,
		taxCents,
		totalCents: subtotalCents + markupCents + taxCents,
		costCents: sum(lines.map((l) => l.costCents)) + roundCents(laborHours * rate.costPerHourCents)
	};
}

export interface OptionPrice {
	id: string;
	name: string;
	selected: boolean;
	totals: BucketTotals;
}

export interface AlternatePrice {
	id: string;
	name: string;
	selectedChoiceId: string;
	choices: (OptionPrice & { deltaCents: number })[];
}

export interface PriceSummary {
	lines: PricedLine[];
	base: BucketTotals;
	options: OptionPrice[];
	alternates: AlternatePrice[];
	totalCents: number;
	depositCents: number;
	balanceCents: number;
	costCents: number;
	marginCents: number;
}

export function includedBuckets(design: ParsedDesign): Set<string> {
	return new Set([
		BASE_BUCKET,
		...design.options.filter((o) => o.selected).map((o) => o.id),
		...design.alternates.map((a) => a.selectedChoiceId)
	]);
}

export function pickLaborRate(catalog: ParsedCatalog): LaborRate {
	const wanted = catalog.settings.labor.rateId;
	const rate = catalog.laborRates.find((r) => r.id === wanted) ?? catalog.laborRates[0];
	return rate ?? { costPerHourCents: 0, pricePerHourCents: 0 };
}

export function priceSummary(
	design: ParsedDesign,
	lines: readonly PricedLine[],
	tasks: readonly LaborTask[],
	rate: LaborRate,
	settings: Settings
): PriceSummary {
	const totalsFor = (bucket: string) =>
		bucketTotals(
			lines.filter((l) => l.bucket === bucket),
			tasks.filter((t) => t.bucket === bucket),
			rate,
			settings
		);
	const base = totalsFor(BASE_BUCKET);
	const options = design.options.map((o) => ({
		id: o.id,
		name: o.name,
		selected: o.selected,
		totals: totalsFor(o.id)
	}));
	const alternates = design.alternates.map((group) => {
		const priced = group.choices.map((c) => ({
			id: c.id,
			name: c.name,
			selected: c.id === group.selectedChoiceId,
			totals: totalsFor(c.id),
			deltaCents: 0
		}));
		const chosen = priced.find((c) => c.selected)?.totals.totalCents ?? 0;
		return {
			id: group.id,
			name: group.name,
			selectedChoiceId: group.selectedChoiceId,
			choices: priced.map((c) => Object.assign(c, { deltaCents: c.totals.totalCents - chosen }))
		};
	});
	const included = [
		base,
		...options.filter((o) => o.selected).map((o) => o.totals),
		...alternates.flatMap((a) => a.choices.filter((c) => c.selected).map((c) => c.totals))
	];
	const totalCents = included.reduce((s, t) => s + t.totalCents, 0);
	const costCents = included.reduce((s, t) => s + t.costCents, 0);
	const beforeTax = included.reduce((s, t) => s + t.totalCents - t.taxCents, 0);
	const depositCents = percentOf(totalCents, settings.depositPercent);
	return {
		lines: [...lines],
		base,
		options,
		alternates,
		totalCents,
		depositCents,
		balanceCents: totalCents - depositCents,
		costCents,
		marginCents: beforeTax - costCents
	};
}
