/**
 * Machines, deliveries and spoil: the lines the crew's own hands do not cover, priced from the price
 * list like any material.
 *
 * - A machine (by the day, with its delivery) wherever `planMachines` put one: a stone whose handling
 *   plan names a loader or a larger machine, or more digging than the firm's threshold. Its days are
 *   its clock hours (machine digging and machine-set stones) over the crew's day, at least one.
 * - Truckloads of stone, aggregate and wall units (blocks and caps): each part's weight over the
 *   truck's payload, when past the weight the firm brings on its own trailer.
 * - Spoil: the dug bank volume swollen by the soil's swell factor (US Army FM 5-434, table 1-2),
 *   hauled away at the price list's haul-off price unless it stays on site.
 * A missing price-list item leaves its line out with a warning, as for any unpriced part.
 */
import { BASE_BUCKET, type Dig, type LaborTask, type MachinePlan } from './labor';
import { SOILS } from './labor-rates';
import {
	priceLine,
	purchaseQuantity,
	quantityInUnit,
	type Measure,
	type PricedLine
} from './pricing';
import type { CatalogItem, ParsedCatalog, Site } from './schema';
import type { StoneResult } from './stones';
import { fromSI, toSI } from './units';
import type { WallResult } from './walls';

export interface MachineNeed {
	bucket: string;
	kind: 'compact' | 'larger';
	/** Clock hours of machine work in this bucket. */
	hours: number;
	/** Days to rent (before the item's increment), 0 when an option rides on the base's machine. */
	days: number;
	/** Whether this bucket brings the machine (and its delivery) itself. */
	delivered: boolean;
}

export interface SpoilResult {
	bucket: string;
	bankM3: number;
	looseM3: number;
	hauled: boolean;
}

export interface DeliveryResult {
	bucket: string;
	massKg: number;
	loads: number;
}

export interface SiteWorkResult {
	machines: MachineNeed[];
	spoil: SpoilResult[];
	deliveries: DeliveryResult[];
}

const MACHINE_KEYS = new Set(['dig-machine', 'stone-compact-loader', 'stone-larger-machine']);
// Bulk aggregate without a density in the price list: about 100 lb/ft³ (common practice, no source).
const DEFAULT_BULK_LB_FT3 = 100;

const sum = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

function machineNeeds(
	plan: MachinePlan,
	tasks: readonly LaborTask[],
	catalog: ParsedCatalog
): MachineNeed[] {
	const day = catalog.settings.labor.hoursPerDay;
	const hoursIn = (bucket: string) =>
		sum(
			tasks.filter((t) => t.bucket === bucket && MACHINE_KEYS.has(t.key)).map((t) => t.hoursEach)
		);
	const kind = (bucket: string) =>
		plan.larger.has(bucket) || (bucket !== BASE_BUCKET && plan.larger.has(BASE_BUCKET))
			? ('larger' as const)
			: ('compact' as const);
	const needs: MachineNeed[] = [];
	for (const bucket of plan.lineBuckets) {
		const hours = hoursIn(bucket);
		needs.push({
			bucket,
			kind: kind(bucket),
			hours,
			days: Math.max(1, hours / day),
			delivered: true
		});
	}
	// An option dug with the base's machine keeps it longer only when its hours pass a rental day.
	if (plan.lineBuckets.has(BASE_BUCKET)) {
		const base = needs.find((n) => n.bucket === BASE_BUCKET)!;
		const skuFor = kindSku(base.kind, catalog);
		const item = catalog.items.find((i) => i.sku === skuFor);
		const rented = (days: number) => (item ? purchaseQuantity(days, item) : Math.ceil(days - 1e-9));
		for (const bucket of plan.buckets) {
			if (bucket === BASE_BUCKET) continue;
			const hours = hoursIn(bucket);
			if (hours <= 0) continue;
			const extra =
				rented(Math.max(1, (base.hours + hours) / day)) - rented(Math.max(1, base.hours / day));
			needs.push({ bucket, kind: base.kind, hours, days: extra, delivered: false });
		}
	}
	return needs;
}

const kindSku = (kind: MachineNeed['kind'], catalog: ParsedCatalog) =>
	kind === 'larger'
		? catalog.settings.equipment.largerMachineSku
		: catalog.settings.equipment.compactMachineSku;

const DELIVERED = new Set<CatalogItem['category']>(['stone', 'aggregate', 'wall']);

/**
 * The weight a priced line carries: stone, bulk aggregate and wall units. Goods sold by the piece
 * or by area (stones, blocks, caps) weigh what the takeoff weighed them at (`pieceKg`, by part and
 * SKU); bulk goods by weight or volume; bagged goods and pipe ride with the crew.
 */
function lineMassKg(
	line: PricedLine,
	item: CatalogItem,
	pieceKg: ReadonlyMap<string, number>
): number {
	if (!DELIVERED.has(item.category)) return 0;
	switch (line.unit) {
		case 'ton':
		case 'lb':
			return toSI(line.quantity, 'mass', line.unit);
		case 'yd3':
		case 'ft3': {
			const volume = toSI(line.quantity, 'volume', line.unit);
			return volume * toSI(item.bulkDensityLbFt3 ?? DEFAULT_BULK_LB_FT3, 'density', 'lb/ft3');
		}
		case 'each':
		case 'ft2':
			return pieceKg.get(`${line.bucket}\u0000${line.sku}`) ?? 0;
		default:
			return 0;
	}
}

export interface SiteWorkInput {
	digs: readonly Dig[];
	machines: MachinePlan;
	tasks: readonly LaborTask[];
	/** The analysed stones with the price-list item each is bought as. */
	stones: readonly { result: StoneResult; sku?: string }[];
	/** The walls with the items their units and caps are bought as. */
	walls?: readonly { result: WallResult; unitSku: string; capSku?: string }[];
	/** The takeoff's priced lines, for the weights that are delivered. */
	lines: readonly PricedLine[];
	site: Site;
}

export function siteWork(
	input: SiteWorkInput,
	catalog: ParsedCatalog
): { result: SiteWorkResult; lines: PricedLine[]; warnings: string[] } {
	const settings = catalog.settings;
	const equipment = settings.equipment;
	const items = new Map(catalog.items.map((i) => [i.sku, i]));
	const lines: PricedLine[] = [];
	const warnings = new Set<string>();
	const add = (
		bucket: string,
		sku: string,
		description: string,
		measure: Measure,
		what: string
	) => {
		const item = items.get(sku);
		if (!item) {
			warnings.add(`No price-list item “${sku}” for ${what}: not priced`);
			return;
		}
		const amount = quantityInUnit(measure, item);
		if (amount === undefined) {
			warnings.add(`“${sku}” is sold by ${item.unit}, which cannot price ${what}`);
			return;
		}
		if (amount <= 0) return;
		lines.push(priceLine({ bucket, sku, description, measure }, item, amount));
	};

	const machines = machineNeeds(input.machines, input.tasks, catalog);
	for (const m of machines) {
		const name = m.kind === 'larger' ? 'Larger machine' : 'Compact loader';
		if (m.days > 0) {
			add(
				m.bucket,
				kindSku(m.kind, catalog),
				`${name}, by the day`,
				{ direct: m.days },
				'the machine'
			);
		}
		if (m.delivered) {
			add(
				m.bucket,
				equipment.machineDeliverySku,
				`${name}: delivery and pick-up`,
				{ direct: 1 },
				'the machine’s delivery'
			);
		}
	}

	const soil = SOILS[input.site.soil];
	const buckets = [...new Set(input.digs.map((d) => d.bucket))];
	const spoil = buckets
		.map((bucket) => {
			const bankM3 = sum(input.digs.filter((d) => d.bucket === bucket).map((d) => d.volumeM3));
			return { bucket, bankM3, looseM3: bankM3 * soil.swell, hauled: input.site.haulSpoil };
		})
		.filter((s) => s.bankM3 > 0);
	for (const s of spoil) {
		if (!s.hauled) continue;
		add(
			s.bucket,
			equipment.haulOffSku,
			`Haul away the dug soil (${soil.label.toLowerCase()}, ${Math.round((soil.swell - 1) * 100)}% swell)`,
			{ volumeM3: s.looseM3 },
			'hauling away the spoil'
		);
	}

	const pieceKg = new Map<string, number>();
	const weigh = (bucket: string | undefined, sku: string | undefined, kg: number) => {
		if (!sku || kg <= 0) return;
		const key = `${bucket ?? BASE_BUCKET}\u0000${sku}`;
		pieceKg.set(key, (pieceKg.get(key) ?? 0) + kg);
	};
	for (const { result, sku } of input.stones) weigh(result.optionId, sku, result.totalWeightKg);
	for (const { result, unitSku, capSku } of input.walls ?? []) {
		weigh(result.optionId, unitSku, result.unitsMassKg);
		weigh(result.optionId, capSku, result.capsMassKg);
	}
	const massBy = new Map<string, number>();
	const withWall = new Set<string>();
	for (const line of input.lines) {
		const item = items.get(line.sku);
		if (!item) continue;
		const kg = lineMassKg(line, item, pieceKg);
		if (kg > 0) massBy.set(line.bucket, (massBy.get(line.bucket) ?? 0) + kg);
		if (kg > 0 && item.category === 'wall') withWall.add(line.bucket);
	}
	const deliveries: DeliveryResult[] = [];
	const tonsOf = (kg: number) => fromSI(kg, 'mass', 'ton');
	for (const [bucket, massKg] of massBy) {
		const tons = tonsOf(massKg);
		if (tons <= equipment.deliveryAboveTons) continue;
		const loads = Math.ceil(tons / equipment.truckCapacityTons - 1e-9);
		deliveries.push({ bucket, massKg, loads });
		add(
			bucket,
			equipment.truckloadSku,
			`Delivery of ${withWall.has(bucket) ? 'stone, aggregate and wall units' : 'stone and aggregate'}: ${tons.toFixed(1)} tons in ${loads} load${loads === 1 ? '' : 's'}`,
			{ direct: loads },
			'deliveries'
		);
	}
	return { result: { machines, spoil, deliveries }, lines, warnings: [...warnings] };
}
