/** The price-list categories the engine knows; the catalog schema validates against this list. */
export const CATEGORIES = [
	'pipe',
	'fitting',
	'valve',
	'pump',
	'basin',
	'liner',
	'filtration',
	'stone',
	'aggregate',
	'wall',
	'lighting',
	'electrical',
	'equipment',
	'other'
] as const;
