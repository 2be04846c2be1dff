// What the demo seeds share: the script's database type, days in the firm's time zone, a demo
// design estimated and priced the way the builder prices it, and the rows of an estimate sent (or
// accepted) from it, its acceptance, and an inquiry's first timeline entry.
import { estimate as runEngine } from '../../src/lib/estimating';
import {
	defaultChoices,
	priceWithOverrides,
	totalsForChoices
} from '../../src/lib/estimating/overrides';
import type { ParsedCatalog } from '../../src/lib/estimating/schema';
import { settings } from '../../src/lib/server/platform/db/schema';
import { newId, newToken, sha256 } from '../../src/lib/server/platform/crypto';
import type { scriptDb } from '../lib/db';

export type Db = ReturnType<typeof scriptDb>['db'];

/** The firm's time zone from Settings (the demo firm's own before Settings are written). */
export async function firmTimeZone(db: Db): Promise<string> {
	const [firm] = await db.select({ timeZone: settings.timeZone }).from(settings).limit(1);
	return firm?.timeZone ?? 'America/Denver';
}

/** yyyy-mm-dd in the firm's time zone, `offset` days from now. */
export function firmDay(timeZone: string, offset: number): string {
	return new Intl.DateTimeFormat('en-CA', {
		timeZone,
		year: 'numeric',
		month: '2-digit',
		day: '2-digit'
	}).format(new Date(Date.now() + offset * 86_400_000));
}

/** A plain copy of a value for a jsonb column. */
export const json = <T>(v: T) => JSON.parse(JSON.stringify(v)) as Record<string, unknown>;

/** A design estimated and priced from the catalog, with the totals of the default choices. */
export function priceDesign<D>(design: D, catalog: ParsedCatalog, failure: string) {
	const engine = runEngine(design, catalog);
	if (!engine.ok) throw new Error(failure);
	const priced = priceWithOverrides(engine, design, catalog, []);
	const choices = defaultChoices(priced.pricing);
	const totals = totalsForChoices(priced.pricing, choices, priced.depositPercent);
	return { design, catalog, engine, priced, choices, totals };
}
export type PricedDesign = ReturnType<typeof priceDesign>;

/** The row of estimate v1 of a lead, sent at `sentAt` by `by`; its link works for 30 days. */
export function estimateRow(
	p: PricedDesign,
	row: { id: string; leadId: string; status: 'sent' | 'accepted'; scope: string; sentAt: Date },
	by: string | null = null
) {
	return {
		...row,
		number: 1,
		design: json(p.design),
		result: json({ engine: p.engine, priced: p.priced }),
		catalog: json(p.catalog),
		totalCents: p.priced.pricing.totalCents,
		taxCents: p.totals.taxCents,
		depositCents: p.priced.pricing.depositCents,
		createdBy: by,
		updatedBy: by,
		sentBy: by,
		tokenHash: sha256(newToken()),
		expiresAt: new Date(row.sentAt.getTime() + 30 * 86_400_000)
	};
}

/** The homeowner's acceptance of estimate v1 with the default choices, from a demo phone. */
export function acceptanceRow(
	p: PricedDesign,
	row: { estimateId: string; typedName: string; acceptedAt: Date; ipAddress: string }
) {
	return {
		...row,
		id: newId(),
		estimateNumber: 1,
		userAgent: 'Demo phone browser',
		revision: 1,
		optionsChosen: p.choices,
		totalCents: p.totals.totalCents,
		depositCents: p.totals.depositCents,
		result: json({
			choices: p.choices,
			totals: p.totals,
			pricing: p.priced.pricing,
			lines: p.priced.lines
		})
	};
}

/** A web inquiry's first timeline entry, as the inquiry form writes it. */
export function inquiryActivity(
	leadId: string,
	inquiry: { message: string; services: string[]; budget: string; timeframe: string },
	at: Date,
	more: Record<string, unknown> = {}
) {
	const { message, services, budget, timeframe } = inquiry;
	return {
		leadId,
		kind: 'inquiry',
		body: message,
		data: { services, budget, timeframe, ...more, source: 'website' },
		createdAt: at
	};
}
