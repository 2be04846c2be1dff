/**
 * The firm's labor rates: how long each kind of work takes, per unit of quantity. The list is the
 * one place a rate is declared: the settings schema gives each a default from it, the price list
 * shows and edits them by key, and the labor CSV reads and writes them by key.
 *
 * Two ways a rate is counted (`per`):
 * - 'person': person-hours per unit. The task's crew-hours are quantity × rate whoever does it;
 *   the people only say how long it takes on the clock.
 * - 'team': clock hours per unit for the whole team the task names (a stone's handling plan, a
 *   machine and its crew). The crew-hours are quantity × rate × people.
 *
 * Every default below is a starting point for a firm to replace with its own figures: common
 * practice, no source.
 */
export interface LaborRateSpec {
	/** Key in settings.labor.rates and the labor CSV's labor_id. */
	key: string;
	/** What the price list shows. */
	label: string;
	/** What one figure is per (shown beside it). */
	unit: string;
	per: 'person' | 'team';
	default: number;
}

const rate = <K extends string>(
	key: K,
	label: string,
	unit: string,
	per: LaborRateSpec['per'],
	dflt: number
) => ({ key, label, unit, per, default: dflt });

// Common practice, no source (every default in this list).
export const LABOR_RATES = [
	rate('dig-hand', 'Dig by hand, loam (person-hours a bank yd³)', 'yd3', 'person', 3),
	rate('dig-machine', 'Dig with a compact machine (machine-hours a bank yd³)', 'yd3', 'team', 0.35),
	rate('basin', 'Set a basin or reservoir: liner, vault, pump', 'basin', 'person', 4),
	rate('fill', 'Place gravel fill in a basin or reservoir', 'yd3', 'person', 2),
	rate('branch', 'Plumb a branch: pipe, valve and outlet', 'branch', 'person', 1.5),
	rate('stone-one-person', 'Set a stone one person can lift', 'stone', 'team', 0.25),
	rate('stone-team-lift', 'Set a stone by a team lift', 'stone', 'team', 0.5),
	rate('stone-cart', 'Set a stone with a cart', 'stone', 'team', 0.5),
	rate('stone-hoist', 'Set a stone with a hoist', 'stone', 'team', 1),
	rate('stone-compact-loader', 'Set a stone with a compact loader', 'stone', 'team', 0.75),
	rate('stone-larger-machine', 'Set a stone with a larger machine', 'stone', 'team', 1.5),
	rate('topping', 'Spread topping', 'yd3', 'person', 2.5),
	rate('wall-face', 'Lay wall units (per ft² of face, buried courses too)', 'ft2', 'person', 0.15),
	rate('wall-base', 'Lay and compact the pad, level the first course', 'ft', 'person', 0.3),
	rate('fixture', 'Set and wire a lighting fixture', 'fixture', 'person', 0.75),
	rate('trench', 'Trench and lay lighting cable', 'ft', 'person', 0.05),
	rate('pond-line', 'Shape shelves and line a pond', 'ft2', 'person', 0.08),
	rate('pond-equipment', 'Set a pond’s skimmer, filter and pump', 'pond', 'person', 4),
	rate('stream', 'Shape, line and rock a stream', 'ft', 'person', 0.5),
	rate('fall', 'Build a fall', 'fall', 'person', 2)
] as const satisfies readonly LaborRateSpec[];

export type LaborRateKey = (typeof LABOR_RATES)[number]['key'];
export const LABOR_RATE_KEYS = LABOR_RATES.map((r) => r.key) as [LaborRateKey, ...LaborRateKey[]];

export function laborRateSpec(key: string): LaborRateSpec | undefined {
	return LABOR_RATES.find((r) => r.key === key);
}

/** The key of the rate for setting a stone by a handling method. */
export const stoneRateKey = (method: string) => `stone-${method}` as LaborRateKey;

/**
 * Soils and what they do to digging. The hand-digging factor multiplies the loam rate (common
 * practice, no source). Swell (bank → loose) and compaction (bank → compacted) are the soil
 * conversion factors of US Army FM 5-434, Earthmoving Operations, table 1-2 ("Soil-conversion
 * factors for earthmoving"): 100 yd³ of sand in place makes 111 yd³ loose and 95 yd³ compacted.
 */
export const SOILS = {
	sand: { label: 'Sand or gravel', handFactor: 0.8, swell: 1.11, compaction: 0.95 },
	loam: { label: 'Loam (common earth)', handFactor: 1, swell: 1.25, compaction: 0.9 },
	clay: { label: 'Clay', handFactor: 1.5, swell: 1.43, compaction: 0.9 },
	rocky: { label: 'Rocky ground (as broken rock)', handFactor: 2.5, swell: 1.5, compaction: 1.3 }
} as const;
export type Soil = keyof typeof SOILS;
export const SOIL_KINDS = Object.keys(SOILS) as [Soil, ...Soil[]];
