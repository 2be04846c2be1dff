// The cautions shown beside the work: the site-visit notes, the crew lead's job page and a change
// order. Titles, reasons and references come from the estimate's own cautions
// ($lib/estimating/cautions), so the visit, the job and the estimate say the same words.
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

const WALL = estimateCaution('wall-height', { wallsNeedingPermit: ['A wall'] });

/** The crew's fixed items: the engine's frozen cautions name only what it sized. */
export const CREW_WALL_ITEM = `${WALL.title}: retaining walls over the local limit are built to the engineer's drawings and the permit. ${WALL.reference}`;
export const CREW_LOCAL_CODES_ITEM = `${LOCAL_CODES.title}. ${LOCAL_CODES.reference}`;

/**
 * The crew's list on the job page: one line per topic. The fixed line of a topic gives way to the
 * frozen estimate's own caution on that topic (it names the stones, the depth, the walls), the
 * engine's other cautions follow, and the local-codes line closes the list.
 */
export function crewCautions(frozen: string[]): string[] {
	const topics: { title: string; fixed: string }[] = [
		{
			title: estimateCaution('locate-utilities', { digs: true }).title,
			fixed: 'Utility locates (811) done and marks visible before any digging.'
		},
		{
			title: estimateCaution('ground-fault-protection', { hasPump: true }).title,
			fixed: 'Pump and lights on a ground-fault (GFCI) protected outdoor circuit.'
		},
		{
			title: estimateCaution('licensed-electrician', { hasPump: true }).title,
			fixed: 'Mains wiring by a licensed electrician.'
		},
		{
			title: estimateCaution('heavy-lifting', { stonesNeedingHelp: ['A stone'] }).title,
			fixed:
				'Heavy stones: enough people or the machine the plan names; never lift alone above the safe limit.'
		},
		{
			title: estimateCaution('open-water', { openWaterDepthM: 0.3, openWaterLimitM: 0.6 }).title,
			fixed: 'Open water: keep the basin covered or fenced while children could reach it.'
		},
		{ title: WALL.title, fixed: CREW_WALL_ITEM }
	];
	const ofTopic = (title: string) => frozen.find((c) => c.startsWith(`${title}:`));
	const known = new Set([...topics.map((t) => t.title), LOCAL_CODES.title]);
	const others = frozen.filter((c) => ![...known].some((title) => c.startsWith(`${title}:`)));
	return [...topics.map((t) => ofTopic(t.title) ?? t.fixed), ...others, CREW_LOCAL_CODES_ITEM];
}

const ELECTRIC = new Set(['lighting', 'electrical', 'pump']);
const CHANGE_WALL_REASON =
	'A wall added by a change order gets the same check as one in the estimate: measure its height from the bottom of the footing and confirm the local limits before building.';

/**
 * Electricity near water for an added light, pump or electrical line; wall height for an added
 * wall; always the local-codes line. Decided from each line's stored category.
 */
export function changeOrderCautions(lines: { category: string; quantity: number }[]): Caution[] {
	const added = new Set(
		lines.filter((l) => l.quantity > 0).map((l) => l.category.trim().toLowerCase())
	);
	const list: Caution[] = [];
	if ([...added].some((c) => ELECTRIC.has(c))) {
		list.push(
			estimateCaution('ground-fault-protection', { hasLighting: true }),
			estimateCaution('licensed-electrician', { hasLighting: true })
		);
	}
	if (added.has('wall')) list.push({ ...WALL, reason: CHANGE_WALL_REASON });
	list.push(LOCAL_CODES);
	return list;
}
