/**
 * The compaction factor that turns a compacted layer (a path's base, its bedding sand) into the
 * loose volume to order: loose ÷ compacted, both per unit of bank (in-place) volume, from the soil
 * conversion factors of US Army FM 5-434, Earthmoving Operations, table 1-2 (labor-rates.ts holds
 * the table): sand or gravel is 1.11 loose and 0.95 compacted per bank yd³, so 1.11 ÷ 0.95 = 1.168.
 */
import { SOILS, type Soil } from './labor-rates';

export function compactionFactor(soil: Soil): number {
	return SOILS[soil].swell / SOILS[soil].compaction;
}

/** The factors the settings start from: a crushed-gravel base and a sand bedding layer. */
export const BASE_COMPACTION_FACTOR = Number(compactionFactor('sand').toFixed(3));
export const BEDDING_COMPACTION_FACTOR = BASE_COMPACTION_FACTOR;
