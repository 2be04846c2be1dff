// The cautions the site-visit notes call for. Titles, reasons and references come from the
// estimate's own cautions ($lib/estimating/cautions), so the visit and the estimate say the same.
import { cautionsFor, type Caution, type CautionFacts } from '$lib/estimating/cautions';
import type { VisitNotes } from '$lib/schema/visits';
import { accessStones, slopeWallReason } from './advice-text';

const NO_FACTS: CautionFacts = {
	digs: false,
	hasPump: false,
	hasLighting: false,
	stonesNeedingHelp: [],
	wallsNeedingPermit: [],
	wallsNeedingEngineering: [],
	openWaterDepthM: 0,
	openWaterLimitM: 0
};

/** One caution of the estimate's list, for the facts given. */
export function estimateCaution(id: string, facts: Partial<CautionFacts> = {}): Caution {
	const found = cautionsFor({ ...NO_FACTS, ...facts }).find((c) => c.id === id);
	if (!found) throw new Error(`The estimate has no caution "${id}" for these facts`);
	return found;
}

export const LOCAL_CODES = estimateCaution('local-codes');

/**
 * Wall height for a moderate or steep slope (the estimate puts a retaining wall in for those),
 * heavy stones once the access width is known, and always the local-codes line.
 */
export function visitCautions(n: Partial<Pick<VisitNotes, 'slope' | 'accessWidthIn'>>): Caution[] {
	const list: Caution[] = [];
	if (n.slope === 'moderate' || n.slope === 'steep') {
		const wall = estimateCaution('wall-height', { wallsNeedingPermit: ['The wall'] });
		list.push({ ...wall, reason: slopeWallReason(n.slope) });
	}
	if (n.accessWidthIn !== undefined && Number.isFinite(n.accessWidthIn)) {
		list.push(
			estimateCaution('heavy-lifting', { stonesNeedingHelp: [accessStones(n.accessWidthIn)] })
		);
	}
	list.push(LOCAL_CODES);
	return list;
}
