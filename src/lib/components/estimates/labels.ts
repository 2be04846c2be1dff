import type { PriceSummary } from '$lib/estimating';

/** A bucket's name as people read it: the base, an option, or "Alternate: choice". */
export function bucketLabel(pricing: PriceSummary, bucket: string): string {
	if (bucket === 'base') return 'The feature';
	const option = pricing.options.find((o) => o.id === bucket);
	if (option) return `Option: ${option.name}`;
	for (const a of pricing.alternates) {
		const c = a.choices.find((x) => x.id === bucket);
		if (c) return `${a.name}: ${c.name}`;
	}
	return bucket;
}

export const UNIT_NAMES: Record<string, string> = {
	each: 'each',
	ft: 'ft',
	ft2: 'ft²',
	ft3: 'ft³',
	yd3: 'yd³',
	ton: 'ton',
	lb: 'lb',
	bag: 'bag',
	load: 'load',
	day: 'day'
};

export const HANDLING_NAMES: Record<string, string> = {
	'one-person': 'One person',
	'team-lift': 'Team lift',
	cart: 'Stone cart',
	hoist: 'Hoist or tripod',
	'compact-loader': 'Compact loader',
	'larger-machine': 'Larger machine'
};

/**
 * Cautions the homeowner should read: utilities, electrical work, a wall that needs a permit or an
 * engineer, open water, and always that local codes and licensed trades come first. Lifting stones
 * is the crew's concern and stays on the office and crew views.
 */
export const HOMEOWNER_CAUTIONS = new Set([
	'locate-utilities',
	'ground-fault-protection',
	'licensed-electrician',
	'wall-height',
	'open-water',
	'local-codes'
]);

/**
 * Lines grouped by the feature they belong to, in the design's order, then the parts shared
 * across the yard (lighting, toppings, walls, extras). One group when nothing names a feature.
 */
export function featureGroups<L extends { feature?: string }>(
	lines: readonly L[],
	design: { features: readonly { id: string; name: string }[] } | null
): { key: string; name: string; lines: L[] }[] {
	const features = design?.features ?? [];
	const known = new Set(features.map((f) => f.id));
	const groups = features
		.map((f) => ({ key: f.id, name: f.name, lines: lines.filter((l) => l.feature === f.id) }))
		.filter((g) => g.lines.length > 0);
	const rest = lines.filter((l) => !l.feature || !known.has(l.feature));
	if (rest.length) {
		groups.push({
			key: 'shared',
			name: groups.length ? 'Around the features' : 'Included',
			lines: rest
		});
	}
	return groups;
}
