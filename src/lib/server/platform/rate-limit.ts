// Per-address request limits with the counters in PostgreSQL (fixed windows), so several app
// processes behind one proxy share them: a flood spread over the processes meets one limit.
import { lt, sql } from 'drizzle-orm';
import { db } from './db';
import { rateCounters } from './db/schema';

export interface RateRule {
	hits: number;
	windowMs: number;
}

const MINUTE = 60_000;
export const minutes = (n: number) => n * MINUTE;

export class SharedRateLimiter {
	constructor(
		readonly name: string,
		readonly rules: readonly RateRule[]
	) {}

	/** Counts this request against each rule; true when any rule is over its limit. */
	async isLimited(event: { getClientAddress(): string }, now = Date.now()): Promise<boolean> {
		const address = event.getClientAddress();
		let limited = false;
		for (const rule of this.rules) {
			const windowStart = new Date(Math.floor(now / rule.windowMs) * rule.windowMs);
			const key = `${this.name}:${rule.windowMs}:${address}`;
			const [row] = await db
				.insert(rateCounters)
				.values({ key, windowStart, hits: 1 })
				.onConflictDoUpdate({
					target: [rateCounters.key, rateCounters.windowStart],
					set: { hits: sql`${rateCounters.hits} + 1` }
				})
				.returning({ hits: rateCounters.hits });
			if (row.hits > rule.hits) limited = true;
		}
		// Now and then, drop windows that ended long ago (the longest rule is a day).
		if (Math.random() < 0.01) {
			await db
				.delete(rateCounters)
				.where(lt(rateCounters.windowStart, new Date(now - 2 * 86_400_000)));
		}
		return limited;
	}
}
