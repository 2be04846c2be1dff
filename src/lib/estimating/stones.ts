/** Stone volumes and weights, and the safe way to set each one (NIOSH lifting equation). */
import type { Settings, Stone } from './schema';
import { KILOGRAMS_PER_POUND, inches, toSI } from './units';
import { ROCK_TYPES, type RockType } from './choices';

// Specific gravity (g/cm³) ranges, "Densities of Common Rock Types", A. Alden, About.com
// Geology (reprinted by ThoughtCo). The engine uses each range's midpoint.
export const ROCK_DENSITY_RANGES = {
	basalt: [2.8, 3.0],
	granite: [2.6, 2.7],
	limestone: [2.3, 2.7],
	sandstone: [2.2, 2.8],
	slate: [2.7, 2.8],
	marble: [2.4, 2.7],
	quartzite: [2.6, 2.8],
	gneiss: [2.6, 2.9],
	andesite: [2.5, 2.8],
	rhyolite: [2.4, 2.6]
} as const satisfies Record<RockType, readonly [number, number]>;

export { ROCK_TYPES, type RockType };

export function rockDensityKgM3(rock: RockType): number {
	const [low, high] = ROCK_DENSITY_RANGES[rock];
	return toSI((low + high) / 2, 'density', 'g/cm3');
}

export interface StoneGeometry {
	volumeM3: number;
	/** Whole surface, m². */
	surfaceM2: number;
	/** Top face (plan area), m². */
	topM2: number;
}

// Regular hexagon of across-flats width F: area = (√3/2)F², side = F/√3.
const HEX_AREA_FACTOR = Math.sqrt(3) / 2;

function prism(topM2: number, perimeterM: number, heightM: number): StoneGeometry {
	return { volumeM3: topM2 * heightM, surfaceM2: 2 * topM2 + perimeterM * heightM, topM2 };
}

// Knud Thomsen's approximation of an ellipsoid's surface, p = 1.6075 (error within 1.061%).
const THOMSEN_P = 1.6075;

function ellipsoid(a: number, b: number, c: number): StoneGeometry {
	const p = THOMSEN_P;
	const surface = 4 * Math.PI * (((a * b) ** p + (a * c) ** p + (b * c) ** p) / 3) ** (1 / p);
	return { volumeM3: (4 / 3) * Math.PI * a * b * c, surfaceM2: surface, topM2: Math.PI * a * b };
}

export function stoneGeometry(size: Stone['size']): StoneGeometry {
	switch (size.shape) {
		case 'column-square': {
			const s = inches(size.sideIn);
			return prism(s * s, 4 * s, inches(size.heightIn));
		}
		case 'column-rect': {
			const [l, w] = [inches(size.lengthIn), inches(size.widthIn)];
			return prism(l * w, 2 * (l + w), inches(size.heightIn));
		}
		case 'column-hex': {
			const f = inches(size.acrossFlatsIn);
			return prism(HEX_AREA_FACTOR * f * f, 6 * (f / Math.sqrt(3)), inches(size.heightIn));
		}
		case 'boulder':
			return ellipsoid(
				inches(size.lengthIn) / 2,
				inches(size.widthIn) / 2,
				inches(size.heightIn) / 2
			);
		case 'slab': {
			const [l, w] = [inches(size.lengthIn), inches(size.widthIn)];
			return prism(l * w, 2 * (l + w), inches(size.thicknessIn));
		}
	}
}

// NIOSH Revised Lifting Equation (Waters et al., NIOSH publication 94-110, 1994), metric form:
// load constant LC = 23 kg (51 lb); HM = 25/H, VM = 1 − 0.003|V − 75|, DM = 0.82 + 4.5/D,
// AM = 1 − 0.0032A, with H, V, D in cm and A in degrees; each multiplier is 0 outside its range.
export const NIOSH_LOAD_CONSTANT_KG = 23;
export const NIOSH_LOAD_CONSTANT_LB = 51;

export function horizontalMultiplier(hCm: number): number {
	if (hCm > 63) return 0;
	return Math.min(1, 25 / hCm);
}

export function verticalMultiplier(vCm: number): number {
	if (vCm > 175) return 0;
	return Math.max(0, 1 - 0.003 * Math.abs(vCm - 75));
}

export function distanceMultiplier(dCm: number): number {
	if (dCm > 175) return 0;
	return Math.min(1, 0.82 + 4.5 / Math.max(dCm, 25));
}

export function asymmetricMultiplier(degrees: number): number {
	if (degrees > 135) return 0;
	return 1 - 0.0032 * degrees;
}

/** NIOSH recommended weight limit for one person, kg, from the lift geometry in the settings. */
export function recommendedWeightLimitKg(lift: Settings['lift']): number {
	return (
		NIOSH_LOAD_CONSTANT_KG *
		horizontalMultiplier(lift.horizontalCm) *
		verticalMultiplier(lift.originHeightCm) *
		distanceMultiplier(lift.travelCm) *
		asymmetricMultiplier(lift.asymmetryDeg) *
		lift.frequencyMultiplier *
		lift.couplingMultiplier
	);
}

export const HANDLING_METHODS = [
	'one-person',
	'team-lift',
	'cart',
	'hoist',
	'compact-loader',
	'larger-machine'
] as const;
export type HandlingMethod = (typeof HANDLING_METHODS)[number];

export interface HandlingPlan {
	method: HandlingMethod;
	people: number;
}

const lb = (value: number) => value * KILOGRAMS_PER_POUND;

/** The share of its members' summed limits a team of this size manages (settings.teamFactors). */
export function teamFactor(people: number, settings: Settings): number {
	const t = settings.teamFactors;
	return people <= 2 ? t.two : people === 3 ? t.three : t.fourOrMore;
}

/** What a team of this size may lift together, kg. */
export const teamLimitKg = (people: number, perPersonKg: number, settings: Settings) =>
	people * perPersonKg * teamFactor(people, settings);

/** The smallest team, two up to the largest allowed, that may lift the weight. */
function teamPeople(weightKg: number, perPersonKg: number, settings: Settings): number | undefined {
	for (let n = 2; n <= settings.maxTeamSize; n++) {
		if (weightKg <= teamLimitKg(n, perPersonKg, settings) + 1e-9) return n;
	}
	return undefined;
}

/**
 * One person up to the NIOSH limit; then the smallest team whose size-adjusted limit covers the
 * stone (a team manages less than the sum of its members, settings.teamFactors), up to the
 * team-lift limit; then a cart, a hoist, a compact loader. A machine still needs the largest
 * team's hands to guide and set the stone, so a heavier stone never needs fewer people.
 */
export function handlingPlan(weightKg: number, settings: Settings): HandlingPlan {
	const perPerson = recommendedWeightLimitKg(settings.lift);
	let bestTeam = 0;
	for (let n = 2; n <= settings.maxTeamSize; n++) {
		bestTeam = Math.max(bestTeam, teamLimitKg(n, perPerson, settings));
	}
	const teamCapacity = perPerson > 0 ? Math.min(lb(settings.teamLiftLimitLb), bestTeam) : 0;
	if (perPerson > 0 && weightKg <= perPerson) return { method: 'one-person', people: 1 };
	if (perPerson > 0 && weightKg <= teamCapacity) {
		return { method: 'team-lift', people: teamPeople(weightKg, perPerson, settings)! };
	}
	const largestTeam =
		teamCapacity > 0 ? (teamPeople(teamCapacity, perPerson, settings) ?? settings.maxTeamSize) : 2;
	const people = Math.max(settings.machineCrew, largestTeam);
	const method: HandlingMethod =
		weightKg <= lb(settings.cartLimitLb)
			? 'cart'
			: weightKg <= lb(settings.hoistLimitLb)
				? 'hoist'
				: weightKg <= lb(settings.loaderLimitLb)
					? 'compact-loader'
					: 'larger-machine';
	return { method, people };
}

export interface StoneResult {
	id: string;
	name: string;
	count: number;
	rock: RockType;
	densityKgM3: number;
	volumeM3: number;
	weightKg: number;
	totalWeightKg: number;
	surfaceM2: number;
	topM2: number;
	wetted: boolean;
	handling: HandlingPlan;
	optionId?: string;
}

export interface StonesResult {
	stones: StoneResult[];
	totalWeightKg: number;
	heaviestKg: number;
	crewNeeded: number;
	wettedSurfaceM2: number;
	wettedTopM2: number;
	warnings: string[];
}

export function stoneResult(stone: Stone, settings: Settings): StoneResult {
	const geometry = stoneGeometry(stone.size);
	const density = rockDensityKgM3(stone.rock);
	const weightKg = geometry.volumeM3 * density;
	return {
		id: stone.id,
		name: stone.name,
		count: stone.count,
		rock: stone.rock,
		densityKgM3: density,
		volumeM3: geometry.volumeM3,
		weightKg,
		totalWeightKg: weightKg * stone.count,
		surfaceM2: geometry.surfaceM2,
		topM2: geometry.topM2,
		wetted: stone.wetted,
		handling: handlingPlan(weightKg, settings),
		optionId: stone.optionId
	};
}

export function analyseStones(stones: readonly Stone[], settings: Settings): StonesResult {
	const results = stones.map((s) => stoneResult(s, settings));
	const wetted = results.filter((s) => s.wetted);
	const warnings = results
		.filter((s) => s.handling.method === 'larger-machine')
		.map(
			(s) => `${s.name} is heavier than the compact loader limit: plan a larger machine or a crane`
		);
	return {
		stones: results,
		totalWeightKg: results.reduce((sum, s) => sum + s.totalWeightKg, 0),
		heaviestKg: Math.max(0, ...results.map((s) => s.weightKg)),
		crewNeeded: Math.max(0, ...results.map((s) => s.handling.people)),
		wettedSurfaceM2: wetted.reduce((sum, s) => sum + s.surfaceM2 * s.count, 0),
		wettedTopM2: wetted.reduce((sum, s) => sum + s.topM2 * s.count, 0),
		warnings
	};
}
