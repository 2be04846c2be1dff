// Lists that the design schema and the engine modules both need: the wire gauges (lighting.ts holds
// their resistances) and the rock types (stones.ts holds their densities). Kept here so that
// schema.ts imports no engine module.
export const GAUGES = ['16', '14', '12', '10', '8'] as const;
export type Gauge = (typeof GAUGES)[number];

export const ROCK_TYPES = [
	'basalt',
	'granite',
	'limestone',
	'sandstone',
	'slate',
	'marble',
	'quartzite',
	'gneiss',
	'andesite',
	'rhyolite'
] as const;
export type RockType = (typeof ROCK_TYPES)[number];
