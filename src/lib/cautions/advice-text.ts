// What helps at a site visit, and the caution before digging.
export const VISIT_HELPS = [
	'A clear way to the spot, and whether a gate is locked or narrow.',
	'Pets kept inside or in another part of the yard while we measure.',
	'Where your outdoor power outlets are, and whether they have ground-fault (GFCI) protection.',
	'Any buried lines you know of: irrigation, gas, cable, septic or a sprinkler system.'
];

export const DIG_CAUTION =
	'We never dig at a first visit. Before any digging, call 811 (or your local utility-locating service) and wait the waiting period they give for the lines to be marked.';

/** For staff reading the site notes: electricity near water. */
export const POWER_CAUTION =
	'Pumps and lights near water need GFCI-protected outdoor circuits; mains wiring is for a licensed electrician, to the local electrical code.';

/** For staff reading the site notes: buried lines before the dig. */
export const LOCATE_CAUTION =
	'No digging until the locate request is made (811 in the US, or the local utility-locating service), its waiting period has passed and the lines are marked; dig by hand near the marks.';

/** Before the wall-height caution when the notes record a moderate or steep slope. */
export const slopeWallReason = (slope: string) =>
	`A ${slope} slope is levelled with a retaining wall about as tall as the fall; measure the fall and confirm the local height limits before building.`;

/** Who the heavy-stone caution names when the access width is recorded. */
export const accessStones = (inches: number) =>
	`Stones and boulders brought in through the ${inches} in access`;
