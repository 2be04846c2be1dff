// What helps at a site visit, and the caution before digging.
export const VISIT_HELPS = [
	'A clear way to the spot, and whether a gate is locked or narrow.',
	'Pets kept inside or in another part of the yard while we measure.',
	'Where your outdoor power outlets are, and whether they have ground-fault (GFCI) protection.',
	'Any buried lines you know of: irrigation, gas, cable, septic or a sprinkler system.'
];

export const DIG_CAUTION =
	'We never dig at a first visit. Before any digging, call 811 (or your local utility-locating service) and wait the waiting period they give for the lines to be marked.';
