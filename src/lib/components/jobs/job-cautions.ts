// Cautions of the job screens, worded as the estimate's own ($lib/estimating/cautions).
import type { Caution } from '$lib/estimating/cautions';
import { estimateCaution, LOCAL_CODES } from '$lib/components/visits/visit-cautions';

const WALL = estimateCaution('wall-height', { wallsNeedingPermit: ['A wall'] });

/** The crew's fixed items: the engine's frozen cautions name only what it sized. */
export const CREW_WALL_ITEM = `${WALL.title}: retaining walls over the local limit are built to the engineer's drawings and the permit. ${WALL.reference}`;
export const CREW_LOCAL_CODES_ITEM = `${LOCAL_CODES.title}. ${LOCAL_CODES.reference}`;

/** The frozen estimate cautions the crew list does not already say. */
export const extraCrewCautions = (frozen: string[]) =>
	frozen.filter((c) => !c.startsWith(LOCAL_CODES.title));

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
