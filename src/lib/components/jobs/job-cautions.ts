// Cautions of the job screens, worded as the estimate's own ($lib/estimating/cautions).
import type { Caution } from '$lib/estimating/cautions';
import { estimateCaution, LOCAL_CODES } from '$lib/components/visits/visit-cautions';

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
