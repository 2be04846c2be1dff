/** The price-list categories the engine knows (the same list as the catalog schema's enum). */
export const CATEGORIES = [
	'pipe',
	'fitting',
	'valve',
	'pump',
	'basin',
	'stone',
	'aggregate',
	'wall',
	'lighting',
	'electrical',
	'other'
] as const;
