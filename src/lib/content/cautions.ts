/**
 * The safety cautions the site shows where it discusses the work. Each defers to local codes and
 * licensed practice; none of them is advice for a particular site.
 */
import type { Project } from './index';
import type { FeatureType } from './types';

export const cautions = {
	dig: {
		title: 'Call 811 before anyone digs',
		text: 'In the US, dial 811 (or file online with your state’s one-call centre) a few working days before digging, so buried power, gas, water and data lines are marked. We make the request for every job and wait for the marks, and we dig by hand near them.'
	},
	electric: {
		title: 'Electricity near water',
		text: 'Pumps and lights near water must be fed from a ground-fault (GFCI) protected, outdoor-rated receptacle with a weatherproof in-use cover. Low-voltage lighting we install ourselves; any new mains circuit or receptacle is installed by a licensed electrician and inspected where your local code requires it.'
	},
	stones: {
		title: 'Heavy stones',
		text: 'A boulder the size of a footstool can weigh several hundred pounds. We plan every lift: enough people, carts, straps and a loader or crane truck for the big ones, and a clear route that does not cross a septic field or a buried line. Please do not move the stones yourself.'
	},
	walls: {
		title: 'Taller walls need an engineer',
		text: 'Retaining walls above a modest height (often around three to four feet, measured from the bottom of the footing), or any wall holding up a slope, driveway or building, usually need an engineer’s design and a building permit. The limit is set by your local code; we check it before we quote and build to the engineer’s drawings.'
	},
	water: {
		title: 'Open water and children',
		text: 'Young children can drown in very little water. Where small children live or visit, we suggest a basin-style feature with no standing water, or a pond that is fenced, shallow at its edges and in sight of the house. Some towns treat deeper ponds like pools and require a barrier; we check your local rules.'
	}
} as const;

export type CautionKind = keyof typeof cautions;

/** The cautions that apply to what a project actually involved. */
export function cautionsFor(project: Pick<Project, 'types' | 'facts'>): CautionKind[] {
	const out: CautionKind[] = ['dig'];
	const { facts, types } = project;
	const wet = types.some((t) => t === 'fountains' || t === 'streams' || t === 'ponds');
	if (wet || (facts.lights ?? 0) > 0 || facts.pumpGph) out.push('electric');
	if ((facts.heaviestStoneLb ?? 0) >= 200) out.push('stones');
	if (types.includes('walls')) out.push('walls');
	if (types.includes('ponds') || (facts.maxDepthIn ?? 0) > 0) out.push('water');
	return out;
}

// Which cautions each kind of work calls for, before any particular site is known: every type here
// digs (a basin, a channel, a cable trench, a footing, a planting hole); water features put a pump
// in water and set heavy stones; ponds (and streams, which can pool) are open water.
const SERVICE_CAUTIONS: Record<CautionKind, readonly FeatureType[]> = {
	dig: ['fountains', 'streams', 'ponds', 'lighting', 'walls', 'paths', 'planting', 'dry-creeks'],
	electric: ['fountains', 'streams', 'ponds', 'lighting'],
	stones: ['fountains', 'streams', 'ponds', 'dry-creeks'],
	walls: ['walls'],
	water: ['ponds']
};

/** The cautions a service page shows for the kinds of work the service covers, in a fixed order. */
export function cautionsForService(service: { types: readonly FeatureType[] }): CautionKind[] {
	return (Object.keys(SERVICE_CAUTIONS) as CautionKind[]).filter((kind) =>
		SERVICE_CAUTIONS[kind].some((type) => service.types.includes(type))
	);
}
