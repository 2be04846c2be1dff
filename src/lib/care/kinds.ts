// The words of seasonal care shared by the office, the homeowner's pages and the server: what
// a feature on record can be, which visits a care plan can hold, and which season each falls in.
export const FEATURE_KINDS = ['fountain', 'pond', 'stream', 'lighting'] as const;
export type FeatureKind = (typeof FEATURE_KINDS)[number];
export const FEATURE_SIZES = ['small', 'medium', 'large'] as const;
export type FeatureSize = (typeof FEATURE_SIZES)[number];

export const FEATURE_LABELS: Record<FeatureKind, string> = {
	fountain: 'Fountain or bubbling stone',
	pond: 'Pond',
	stream: 'Stream or waterfall',
	lighting: 'Landscape lighting'
};

export const VISIT_KINDS = ['startup', 'cleanout', 'shutdown', 'lighting'] as const;
export type VisitKind = (typeof VISIT_KINDS)[number];
export const SEASONS = ['spring', 'summer', 'autumn'] as const;
export type Season = (typeof SEASONS)[number];

export const VISIT_LABELS: Record<VisitKind, string> = {
	startup: 'Spring start-up',
	cleanout: 'Summer clean-out',
	shutdown: 'Autumn shut-down',
	lighting: 'Lighting check'
};

/** The season each visit belongs to: shut-downs and the lighting check before the first frost. */
export const VISIT_SEASON: Record<VisitKind, Season> = {
	startup: 'spring',
	cleanout: 'summer',
	shutdown: 'autumn',
	lighting: 'autumn'
};

/** Which features a visit serves: water visits the water features, the lighting check the lights. */
export function visitServes(visit: VisitKind, feature: FeatureKind): boolean {
	return visit === 'lighting' ? feature === 'lighting' : feature !== 'lighting';
}

export const SEASON_LABELS: Record<Season, string> = {
	spring: 'Spring',
	summer: 'Summer',
	autumn: 'Autumn'
};

/** Per-visit prices in cents by feature kind and size (0 or missing: the plan does not cover it). */
export type PriceTable = Partial<Record<FeatureKind, Partial<Record<FeatureSize, number>>>>;

export interface PlanVisit {
	kind: VisitKind;
	/** Time on site, for fitting visits into a crew's day. */
	minutes: number;
	checklist: string[];
}

/** The price of one visit of this kind for one feature, or null when the plan does not cover it. */
export function visitPrice(
	prices: PriceTable,
	visit: VisitKind,
	feature: { kind: FeatureKind; size: FeatureSize }
): number | null {
	if (!visitServes(visit, feature.kind)) return null;
	const cents = prices[feature.kind]?.[feature.size];
	return cents && cents > 0 ? cents : null;
}

export interface QuoteLine {
	featureId: string;
	feature: FeatureKind;
	size: FeatureSize;
	visit: VisitKind;
	cents: number;
}

/** Every visit the plan would make to these features in a year, with its price. */
export function quotePlan(
	plan: { visits: PlanVisit[]; prices: PriceTable },
	features: { id: string; kind: FeatureKind; size: FeatureSize }[]
): { lines: QuoteLine[]; yearCents: number } {
	const lines: QuoteLine[] = [];
	for (const v of plan.visits) {
		for (const f of features) {
			const cents = visitPrice(plan.prices, v.kind, f);
			if (cents !== null) {
				lines.push({ featureId: f.id, feature: f.kind, size: f.size, visit: v.kind, cents });
			}
		}
	}
	return { lines, yearCents: lines.reduce((sum, l) => sum + l.cents, 0) };
}

/**
 * What each size means to a homeowner, in the same counts a completed job is sized by (outlets,
 * depth zones, falls, fixtures; common practice, no source).
 */
export const SIZE_HINTS: Record<FeatureKind, Record<FeatureSize, string>> = {
	fountain: {
		small: 'one stone or bubbler',
		medium: 'two or three outlets',
		large: 'four outlets or more'
	},
	pond: {
		small: 'one depth throughout',
		medium: 'a planting shelf and a deep part',
		large: 'several shelves'
	},
	stream: { small: 'one fall', medium: 'two or three falls', large: 'four falls or more' },
	lighting: { small: 'up to 4 lights', medium: '5 to 10 lights', large: 'more than 10 lights' }
};
