/**
 * Feature types: the vocabulary of the portfolio. Each has an index page at `/work/type/<slug>`.
 * Add a type here (and only here) before using it in a project's front matter.
 */
export const featureTypes = {
	fountains: {
		label: 'Stone fountains',
		blurb:
			'Bubbling boulders, drilled columns, spillways and spouts over a hidden basin: moving water with no open pool to look after.'
	},
	streams: {
		label: 'Streams and waterfalls',
		blurb:
			'Pondless streams that run down a slope and vanish into gravel, with falls tuned to the sound you want.'
	},
	ponds: {
		label: 'Ponds',
		blurb: 'Small ponds with shelves for planting, clean edges and water that stays clear.'
	},
	lighting: {
		label: 'Garden lighting',
		blurb: 'Low-voltage light on water, stone and paths, on a timer, with the cable buried.'
	},
	walls: {
		label: 'Walls and terraces',
		blurb: 'Seat walls, low retaining walls and level terraces built on a proper base.'
	},
	paths: {
		label: 'Paths and paving',
		blurb: 'Flagstone, stepping stones and gravel paths that stay put through freeze and thaw.'
	},
	planting: {
		label: 'Planting',
		blurb: 'Hardy planting that softens stone and water and survives the winters here.'
	},
	'dry-creeks': {
		label: 'Dry creeks and drainage',
		blurb: 'Stone-lined channels that carry storm water away and look good when dry.'
	}
} as const;

export type FeatureType = keyof typeof featureTypes;

export const featureTypeSlugs = Object.keys(featureTypes) as [FeatureType, ...FeatureType[]];

export const seasons = ['spring', 'summer', 'autumn', 'winter'] as const;
export type Season = (typeof seasons)[number];
