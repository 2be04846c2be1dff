/**
 * Volume changes of granular materials between the bank (in place), loose (in the truck) and
 * compacted states, and the compaction factor that turns a compacted layer into the loose volume
 * to order.
 *
 * Swell, bank to loose: "Swell factors for various soils", projectengineer.net (the material table
 * of the Caterpillar Performance Handbook): gravel, dry 12%; sand, dry 12%.
 * Compacted volume per bank volume: "Earthwork bulking and shrinkage", infralens.in handbook,
 * compaction factors (bank to compacted, standard Proctor): gravel-sand 0.88–0.93; sand 0.88–0.92.
 * The engine takes each range's midpoint.
 */
export const SWELL_PERCENT = { gravel: 12, sand: 12 } as const;
export const COMPACTED_PER_BANK = {
	gravel: [0.88, 0.93],
	sand: [0.88, 0.92]
} as const satisfies Record<keyof typeof SWELL_PERCENT, readonly [number, number]>;

export type GranularMaterial = keyof typeof SWELL_PERCENT;

/** Loose volume delivered per unit of compacted volume in place: (1 + swell) ÷ (compacted/bank). */
export function compactionFactor(material: GranularMaterial): number {
	const [low, high] = COMPACTED_PER_BANK[material];
	return (1 + SWELL_PERCENT[material] / 100) / ((low + high) / 2);
}

/** The compaction factors the settings start from: a gravel base and a sand bedding layer. */
export const BASE_COMPACTION_FACTOR = Number(compactionFactor('gravel').toFixed(3));
export const BEDDING_COMPACTION_FACTOR = Number(compactionFactor('sand').toFixed(3));
