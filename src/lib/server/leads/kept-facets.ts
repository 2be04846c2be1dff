// What the list keeps between requests, each with the snapshot it was found in, and one list page
// that reuses it while no lead has changed (see listSql):
// - the facets of a view counted exactly (service, dates, search), across its pages and chips;
// - where the pages of a view begin (the sort key of the first row of a page, and of the last row
//   of the page before), so that a deep page seeks to its first row in the sort's index instead
//   of skipping `offset` entries. The answer is the same either way: the start is used only while
//   no transaction the snapshot could not see has changed leads;
// - every match of a search (up to KEPT_MATCHES, lead number and stage in the view's order), so
//   that its next pages and stage chips read their 25 leads by number instead of searching again.
import { STAGES, type LeadQuery, type Stage } from '../../schema/leads';
import {
	countsExactly,
	listSql,
	searchTerms,
	type LeadList,
	type LeadRow,
	type ListContext,
	type PageStart,
	type Statement
} from './list-sql';

/** A small map that forgets the least recently used entries, and entries older than `ttlMs`. */
class Recent<T> {
	readonly #entries = new Map<string, { value: T; at: number }>();
	constructor(
		readonly max: number,
		readonly ttlMs: number
	) {}

	get(key: string | null): T | undefined {
		if (key === null) return undefined;
		const entry = this.#entries.get(key);
		if (!entry) return undefined;
		this.#entries.delete(key);
		if (Date.now() - entry.at > this.ttlMs) return undefined;
		this.#entries.set(key, entry); // most recently used last
		return entry.value;
	}

	set(key: string | null, value: T): void {
		if (key === null) return;
		this.#entries.delete(key);
		this.#entries.set(key, { value, at: Date.now() });
		while (this.#entries.size > this.max) {
			this.#entries.delete(this.#entries.keys().next().value!);
		}
	}
}

/** Every match of a search in the order of `order` (sort and direction): number and stage. */
interface KeptMatches {
	order: string;
	numbers: Int32Array;
	stages: Uint8Array;
}

interface KeptEntry {
	snapshot: string;
	facets: Record<Stage, number>;
	matches?: KeptMatches;
}

/**
 * Facets counted exactly, each with the snapshot it was counted in, for the views seen lately
 * (at most `max`, each for at most `ttlMs`; `lead_list_changes` keeps a day of changes, far more),
 * with a search's matches, and the starts of their pages (`starts`, a few per view).
 */
export class KeptFacets {
	readonly #facets: Recent<KeptEntry>;
	readonly starts: Recent<PageStart>;
	constructor(max = 200, ttlMs = 10 * 60_000) {
		this.#facets = new Recent(max, ttlMs);
		this.starts = new Recent(max * 5, ttlMs);
	}

	get(key: string | null): KeptEntry | undefined {
		return this.#facets.get(key);
	}

	set(
		key: string | null,
		snapshot: string | null,
		facets: Record<Stage, number>,
		matches?: KeptMatches
	): void {
		if (snapshot) this.#facets.set(key, { snapshot, facets, matches });
	}
}

const orderOf = (q: LeadQuery) => `${q.sort} ${q.dir}`;

/** The lead numbers of the page, picked from the kept matches of its view in the same order. */
function pickPage(q: LeadQuery, matches: KeptMatches | undefined): number[] | null {
	if (!matches || matches.order !== orderOf(q)) return null;
	const inView = new Set(q.stage.map((st) => STAGES.indexOf(st) + 1));
	let skip = (q.page - 1) * q.size;
	const page: number[] = [];
	for (let i = 0; i < matches.numbers.length && page.length < q.size; i++) {
		if (inView.size && !inView.has(matches.stages[i])) continue;
		if (skip > 0) skip--;
		else page.push(matches.numbers[i]);
	}
	return page;
}

/** `_matches` of a counting answer (each the lead number times 8 plus its stage, 1-based). */
function keptMatches(q: LeadQuery, list: unknown): KeptMatches | undefined {
	if (!Array.isArray(list)) return undefined;
	const numbers = new Int32Array(list.length);
	const stages = new Uint8Array(list.length);
	list.forEach((v: number, i) => {
		numbers[i] = Math.floor(v / 8);
		stages[i] = v % 8;
	});
	return { order: orderOf(q), numbers, stages };
}

export type RunStatement = (s: Statement) => Promise<readonly Record<string, unknown>[]>;

/**
 * postgres.js options for the list's statements: prepared, even with no parameters (postgres.js
 * sends a statement without parameters as a simple query, planned anew each time, unless told).
 */
export const PREPARED = { prepare: true, simple: false } as { prepare: boolean };

/**
 * One list page through `run` (the app's client or the benchmark's), reusing the facets and the
 * page starts of the same view kept in `kept` while no lead has changed, and keeping those it finds.
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
	const pages = pagesKey(q, ctx);
	const startOf = (page: number) => (pages === null ? null : `${page} ${pages}`);
	const start = q.page > 1 ? kept.starts.get(startOf(q.page)) : undefined;
	const page = pickPage(q, held?.matches);
	let result = await run(listSql(q, ctx, asTyped, held?.snapshot ?? null, { start, page }));
	if (start && result[0]?._sought === false) {
		// A lead has changed since the page's start was found: the page by offset instead.
		result = await run(listSql(q, ctx, asTyped, held?.snapshot ?? null, { page }));
	}
	const snapshot = result[0]?._snapshot as string | undefined;
	const rows = result.filter((r) => r.id != null);
	if (snapshot && rows.length) {
		const at = (r: Record<string, unknown>, inclusive: boolean): PageStart => ({
			snapshot,
			key: r._key as string,
			number: r.number as number,
			inclusive
		});
		if (q.page > 1) kept.starts.set(startOf(q.page), at(rows[0], true));
		if (rows.length === q.size) kept.starts.set(startOf(q.page + 1), at(rows.at(-1)!, false));
	}
	const counted = result[0]?._counted !== false;
	if (!counted && held) return assembleList(q, result, held.facets);
	const list = assembleList(q, result);
	kept.set(key, snapshot ?? null, list.facets, keptMatches(q, result[0]?._matches));
	return list;
}

/** The filters of a view other than stage, search and dates, as parts of a key. */
const filtersBesideStage = (q: LeadQuery, ctx: ListContext) => [
	[...q.service].sort(),
	[...q.budget].sort(),
	q.assignee === 'mine' ? ctx.userId : (q.assignee ?? null),
	q.awaiting
];

/**
 * The key under which the facets of a view may be kept between its pages and stage chips: every
 * filter but stage (and sort and paging, which do not change the counts). Null when the facets
 * come from `lead_counts` anyway, or depend on the firm's time zone (dates), which a change of
 * the settings could move without touching a lead.
 */
export function facetsKey(q: LeadQuery, ctx: ListContext, asTyped = false): string | null {
	if (!countsExactly(q) || q.from || q.to) return null;
	return JSON.stringify([...filtersBesideStage(q, ctx), searchTerms(q.q), asTyped]);
}

/**
 * The key under which the starts of a view's pages may be kept (PageStart): every filter, the sort
 * and the page size. Null for a search (its pages come from its set of matches, see listSql) and
 * for dates (see facetsKey).
 */
export function pagesKey(q: LeadQuery, ctx: ListContext): string | null {
	if (searchTerms(q.q).length || q.from || q.to) return null;
	return JSON.stringify([
		[...q.stage].sort(),
		...filtersBesideStage(q, ctx),
		q.sort,
		q.dir,
		q.size
	]);
}

const iso = (v: unknown) => new Date(v as string).toISOString();

/** A result row of listSql as the API's row (times as ISO strings). */
export function leadRow(r: Record<string, unknown>): LeadRow {
	return {
		id: r.id as string,
		number: r.number as number,
		createdAt: iso(r.createdAt),
		stage: r.stage as Stage,
		services: r.services as string[],
		budget: r.budget as string,
		priority: r.priority as string,
		source: r.source as string,
		firstReplyAt: r.firstReplyAt ? iso(r.firstReplyAt) : null,
		lastTouchAt: iso(r.lastTouchAt),
		closeReason: (r.closeReason as string | null) ?? null,
		assigneeId: (r.assigneeId as string | null) ?? null,
		assigneeName: (r.assigneeName as string | null) ?? null,
		name: r.name as string,
		email: (r.email as string | null) ?? null,
		phone: (r.phone as string | null) ?? null,
		town: (r.town as string | null) ?? null
	};
}

/**
 * The API's answer from the rows of listSql: the page, the facets per stage (`keptFacets` when
 * the statement left them out) and the total.
 */
export function assembleList(
	q: LeadQuery,
	result: readonly Record<string, unknown>[],
	keptFacets?: Record<Stage, number>
): LeadList {
	const facets = Object.fromEntries(STAGES.map((st) => [st, 0])) as Record<Stage, number>;
	const counted = (keptFacets ?? result[0]?._facets ?? {}) as Partial<Record<Stage, number>>;
	for (const st of STAGES) facets[st] = counted[st] ?? 0;
	const inView: readonly Stage[] = q.stage.length ? q.stage : STAGES;
	return {
		rows: result.filter((r) => r.id != null).map(leadRow),
		total: inView.reduce<number>((sum, st) => sum + facets[st], 0),
		page: q.page,
		size: q.size,
		facets
	};
}
