// Facets counted exactly, kept per view with the snapshot they were counted in, and one list page
// that reuses them while no lead has changed (see listSql).
import type { LeadQuery, Stage } from '../../schema/leads';
import {
	assembleList,
	facetsKey,
	listSql,
	type LeadList,
	type ListContext,
	type Statement
} from './list-sql';

interface KeptEntry {
	snapshot: string;
	facets: Record<Stage, number>;
	at: number;
}

/**
 * Facets counted exactly, each with the snapshot it was counted in, for the views seen lately
 * (at most `max`, each for at most `ttlMs`; `lead_list_changes` keeps a day of changes, far more).
 */
export class KeptFacets {
	readonly #entries = new Map<string, KeptEntry>();
	constructor(
		readonly max = 200,
		readonly ttlMs = 10 * 60_000
	) {}

	get(key: string | null): KeptEntry | undefined {
		if (key === null) return undefined;
		const entry = this.#entries.get(key);
		if (!entry) return undefined;
		this.#entries.delete(key);
		if (Date.now() - entry.at > this.ttlMs) return undefined;
		this.#entries.set(key, entry); // most recently used last
		return entry;
	}

	set(key: string | null, snapshot: string | null, facets: Record<Stage, number>): void {
		if (key === null || !snapshot) return;
		this.#entries.delete(key);
		this.#entries.set(key, { snapshot, facets, at: Date.now() });
		while (this.#entries.size > this.max) {
			this.#entries.delete(this.#entries.keys().next().value!);
		}
	}
}

export type RunStatement = (s: Statement) => Promise<readonly Record<string, unknown>[]>;

/**
 * One list page through `run` (the app's client or the benchmark's), reusing the facets of the
 * same view kept in `kept` while no lead has changed, and keeping those it counts.
 */
export async function runList(
	q: LeadQuery,
	ctx: ListContext,
	kept: KeptFacets,
	run: RunStatement,
	asTyped = false
): Promise<LeadList> {
	const key = facetsKey(q, ctx, asTyped);
	const held = kept.get(key);
	const result = await run(listSql(q, ctx, asTyped, held?.snapshot ?? null));
	const counted = result[0]?._counted !== false;
	if (!counted && held) return assembleList(q, result, held.facets);
	const list = assembleList(q, result);
	kept.set(key, (result[0]?._snapshot as string | undefined) ?? null, list.facets);
	return list;
}
