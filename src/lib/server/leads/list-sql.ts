// The SQL of the leads list, with no SvelteKit imports: the app runs it, and so does the
// benchmark's bare node:http baseline (scripts/bench/leads.ts), so both measure the same queries
// (both prepared: `{ prepare: true }`) and shape the answer the same way (runList, kept-facets.ts).
//
// One statement per page (migration 0010_leads_list_speed):
// - the page's 25 lead ids come first, from the covering index of the sort (index-only, so
//   OFFSET skips index entries, not joined rows); only those rows are then joined to contacts,
//   properties and users;
// - the stage facets come from the trigger-kept `lead_counts` when only stage, assignee, budget
//   or "awaiting" filter the list, and are counted exactly (through the indexes) otherwise;
// - a search first collects its matches once (a materialised CTE, so the planner cannot turn it
//   into a walk of the newest leads): words through the full-text GIN index of search_words, other
//   fragments through the trigram index of search_text (searchParts); both the page and the
//   facets are taken from that set;
// - facets counted exactly (service, dates, search) are kept by the caller with the snapshot they
//   were counted in (KeptFacets): the next page or stage chip of the same view passes that
//   snapshot back, and the statement counts again only if a transaction it could not see has
//   since changed leads (`lead_list_changes`). Otherwise it reads only the page: for a search,
//   the GIN scan then takes the stage too (the `~stage:` lexemes of search_words), so it reads
//   the page's stages only, not every match. A search's matches are kept too (up to
//   KEPT_MATCHES), and so are the starts of deep pages: see listSql's `known`.
import { BUDGETS, STAGES, type LeadQuery, type Stage } from '../../schema/leads';

/**
 * The most matches of a search kept with its facets (lead number and stage, 5 bytes each in the
 * app): more are not kept, and the view's next pages are then searched again (through the index).
 */
export const KEPT_MATCHES = 10_000;
// A kept match packs its stage into three bits (lead number times 8 plus 1 to 7): more stages
// would read as the wrong stage, so they need another packing first.
if (STAGES.length > 7) throw new Error('The kept search matches hold at most 7 lead stages');

/** Days are the firm's days: the time zone comes from the settings row, inside the query. */
const FIRM_TZ = `(select time_zone from settings where id = 1)`;

export interface ListContext {
	userId: string;
}

export interface Statement {
	text: string;
	params: unknown[];
}

export interface LeadRow {
	id: string;
	number: number;
	createdAt: string;
	stage: Stage;
	services: string[];
	budget: string;
	priority: string;
	source: string;
	firstReplyAt: string | null;
	lastTouchAt: string;
	closeReason: string | null;
	assigneeId: string | null;
	assigneeName: string | null;
	name: string;
	email: string | null;
	phone: string | null;
	town: string | null;
}

export interface LeadList {
	rows: LeadRow[];
	total: number;
	page: number;
	size: number;
	facets: Record<Stage, number>;
}

/** Each sort key is a column of leads (name and town are kept there by triggers) with an index. */
export const SORT_SQL: Record<LeadQuery['sort'], string> = {
	received: 'l.created_at',
	name: 'l.sort_name',
	town: 'l.sort_town',
	stage: 'l.stage',
	budget: `coalesce(array_position(array[${BUDGETS.map((b) => `'${b.replace(/'/g, "''")}'`).join(',')}]::text[], l.budget), ${BUDGETS.length + 1})`,
	last_touch: 'l.last_touch_at'
};

/** The type of each sort key, for a key passed back as text (PageStart). */
const KEY_TYPE: Record<LeadQuery['sort'], string> = {
	received: 'timestamptz',
	name: 'text',
	town: 'text',
	stage: 'lead_stage',
	budget: 'int',
	last_touch: 'timestamptz'
};

/**
 * Where a page of a view begins, found by an earlier answer in `snapshot`: at the row whose sort
 * key (as text, exact to the microsecond) and number are `key` and `number` (`inclusive`), or just
 * after it (the last row of the page before).
 */
export interface PageStart {
	snapshot: string;
	key: string;
	number: number;
	inclusive: boolean;
}

const ROW_COLUMNS = `l.id, l.number, l.created_at as "createdAt", l.stage, l.services, l.budget,
		l.priority, l.source, l.first_reply_at as "firstReplyAt", l.last_touch_at as "lastTouchAt",
		l.close_reason as "closeReason", l.assignee_id as "assigneeId", u.name as "assigneeName",
		c.name, c.email, c.phone, p.town`;

export const ROW_JOINS = `join contacts c on c.id = l.contact_id
	left join properties p on p.id = l.property_id
	left join users u on u.id = l.assignee_id`;

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => '\\' + c);

/** Search terms: lower-cased words, each must appear somewhere in the lead's search text. */
export function searchTerms(q: string | undefined): string[] {
	if (!q) return [];
	return q.toLowerCase().split(/\s+/).filter(Boolean).slice(0, 6);
}

/** Any of these services, as a tsquery of the lexemes `~service:<key>` in search_words. */
const serviceQuery = (services: string[]) =>
	services.map((s) => `'~service:${s.replace(/\\/g, '\\\\').replace(/'/g, "''")}'`).join(' | ');

/** Any of these stages, as a tsquery of the lexemes `~stage:<stage>` in search_words. */
const stageQuery = (stages: readonly Stage[]) => stages.map((s) => `'~stage:${s}'`).join(' | ');

/**
 * Any of these services in any of these stages, as a tsquery of the lexemes
 * `~service-stage:<key>:<stage>` in search_words (far rarer than either alone).
 */
const serviceStageQuery = (services: string[], stages: readonly Stage[]) =>
	services
		.flatMap((s) => {
			const key = s.replace(/\\/g, '\\\\').replace(/'/g, "''");
			return stages.map((st) => `'~service-stage:${key}:${st}'`);
		})
		.join(' | ');

/** A word of a name, town or message: letters, maybe joined by apostrophes or hyphens. */
const WORD = /^[\p{L}\p{M}]+(?:['’-][\p{L}\p{M}]+)*$/u;

/**
 * How each term is searched. A word ("brookstone", "o'rourke", "saint-étienne") goes to full-text
 * search: each of its parts (`words`) must begin a word of the lead (`search_words`, accents
 * ignored), all of them in one tsquery. Anything else (digits, "@", ".", "%"…: phone numbers and e-mail
 * fragments) must appear as typed in `search_text`, through the trigram index.
 * With `asTyped`, every term is a fragment: the second try of a word search that found nothing,
 * for words that are only part of a token of the simple parser, such as the "gmail" of an
 * e-mail address (listLeads).
 */
export function searchParts(
	q: string | undefined,
	asTyped = false
): { words: string[] | null; fragments: string[] } {
	const words: string[] = [];
	const fragments: string[] = [];
	for (const term of searchTerms(q)) {
		if (!asTyped && WORD.test(term)) words.push(...term.split(/['’-]/));
		else fragments.push(term);
	}
	return { words: words.length ? words : null, fragments };
}

/** Numbered parameters shared by every part of one statement. */
export class Params {
	readonly values: unknown[] = [];
	add(v: unknown): string {
		this.values.push(v);
		return `$${this.values.length}`;
	}
}

export const stageClause = (q: LeadQuery, p: Params, alias: string) =>
	`${alias}.stage = any(${p.add(q.stage)}::lead_stage[])`;

/**
 * The filters other than stage, on leads `l`. With `stageInWords`, a word search also takes the
 * stage filter into its tsquery (the caller then adds no stage clause when `words` is set).
 */
export function filterClauses(
	q: LeadQuery,
	ctx: ListContext,
	p: Params,
	search = true,
	asTyped = false,
	stageInWords = false
): string[] {
	const clauses: string[] = [];
	const words = search ? searchParts(q.q, asTyped).words : null;
	if (q.service.length && !words) clauses.push(`l.services && ${p.add(q.service)}::text[]`);
	if (q.budget.length) clauses.push(`l.budget = any(${p.add(q.budget)}::text[])`);
	if (q.assignee === 'mine') clauses.push(`l.assignee_id = ${p.add(ctx.userId)}`);
	else if (q.assignee === 'unassigned') clauses.push('l.assignee_id is null');
	else if (q.assignee) clauses.push(`l.assignee_id = ${p.add(q.assignee)}`);
	if (q.from) {
		clauses.push(`l.created_at >= (${p.add(q.from)}::date::timestamp at time zone ${FIRM_TZ})`);
	}
	if (q.to) {
		clauses.push(`l.created_at < ((${p.add(q.to)}::date + 1)::timestamp at time zone ${FIRM_TZ})`);
	}
	if (q.awaiting) clauses.push(`l.first_reply_at is null and l.stage not in ('sold', 'closed')`);
	if (search) {
		if (words) {
			// With words to look for, the service filter joins the same tsquery (the services are
			// lexemes of search_words too), so one GIN scan answers both.
			// rillstone_words_query: each part must begin a word, asked as the exact words it begins
			// (from `lead_words`), far cheaper in the GIN index than a prefix match. In a sub-select,
			// so that it runs once per statement, never once per row.
			const parts = [`rillstone_words_query(${p.add(words)}::text[])`];
			const stages = stageInWords && q.stage.length > 0;
			if (q.service.length && stages) {
				parts.push(`${p.add(serviceStageQuery(q.service, q.stage))}::tsquery`);
			} else if (q.service.length) parts.push(`${p.add(serviceQuery(q.service))}::tsquery`);
			else if (stages) parts.push(`${p.add(stageQuery(q.stage))}::tsquery`);
			clauses.push(`l.search_words @@ (select ${parts.join(' && ')})`);
		}
		for (const term of searchParts(q.q, asTyped).fragments) {
			clauses.push(`l.search_text like ${p.add(`%${escapeLike(term)}%`)}`);
		}
	}
	return clauses;
}

export const where = (clauses: string[]) =>
	clauses.length ? `where ${clauses.join(' and ')}` : '';

/** Facets from the counter table: possible when every filter but stage is one of its keys. */
function countedFacets(q: LeadQuery, ctx: ListContext, p: Params): string | null {
	if (q.service.length || q.from || q.to || searchTerms(q.q).length) return null;
	const clauses: string[] = [];
	if (q.budget.length) clauses.push(`budget = any(${p.add(q.budget)}::text[])`);
	if (q.assignee === 'mine') clauses.push(`assignee_id = ${p.add(ctx.userId)}`);
	else if (q.assignee === 'unassigned') clauses.push(`assignee_id = ''`);
	else if (q.assignee) clauses.push(`assignee_id = ${p.add(q.assignee)}`);
	if (q.awaiting) clauses.push(`unreplied and stage not in ('sold', 'closed')`);
	return `select stage, sum(n)::int as n from lead_counts ${where(clauses)} group by stage`;
}

/**
 * Whether the stage facets of a view are counted exactly (service, dates or search filter it)
 * rather than summed from `lead_counts`.
 */
export const countsExactly = (q: LeadQuery) =>
	q.service.length > 0 || !!q.from || !!q.to || searchTerms(q.q).length > 0;

/**
 * True when the facets must be counted: no snapshot was kept, or a transaction that the kept
 * snapshot could not see has since committed a change to leads (one row of `lead_list_changes`
 * per writing transaction, kept by a trigger).
 */
function recountSql(p: Params, kept: string | null): string {
	const s = `${p.add(kept)}::pg_snapshot`;
	return `(${s} is null or exists (
		select 1 from lead_list_changes x
		where x.xid >= pg_snapshot_xmin(${s}) and not pg_visible_in_snapshot(x.xid, ${s})
	))`;
}

/**
 * The one statement of a list page: a row per lead of the page, each carrying the stage facets
 * (`_facets`) and its sort key (`_k`, and `_key` as text); a single row of nulls with the facets
 * when the page is empty. Facets count every stage under the other filters, so the stage chips
 * show what a click gives.
 *
 * `kept` is the snapshot (`_snapshot` of an earlier answer of the same view, see facetsKey) in
 * which the caller counted the facets it still holds. When no lead has changed since, the
 * statement leaves the facets out (`_counted` false, `_facets` empty) and reads only the page.
 * `known.start` (unsearched views only, see pagesKey) is where an earlier answer found the page to
 * begin: while no lead has changed since, the page is read from there instead of by offset;
 * otherwise the answer has no rows and `_sought` false, and the page must be asked by offset.
 * A search's counting answer also lists every match in the view's order (`_matches`: lead number
 * and stage, up to KEPT_MATCHES); `known.page`, the numbers of the page's leads picked from that
 * list, is then read instead of searching again while no lead has changed.
 */
export function listSql(
	q: LeadQuery,
	ctx: ListContext,
	asTyped = false,
	kept: string | null = null,
	known: { start?: PageStart | null; page?: number[] | null } = {}
): Statement {
	const p = new Params();
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	// The size is a literal (one of a few), the offset a parameter of deeper pages only: with a
	// parameter in LIMIT or OFFSET the planner prices a generic plan as if a tenth of the rows were
	// read, so it plans every request again (custom plans); this way one prepared statement per
	// view's first page (and one for its deeper pages) keeps its generic plan.
	const limit = `limit ${Math.trunc(q.size)}`;
	const paging = () =>
		q.page > 1 ? `${limit} offset ${p.add((q.page - 1) * q.size)}::int` : limit;
	const key = SORT_SQL[q.sort];
	const exact = countsExactly(q);
	// `c` is evaluated once (an InitPlan); `(select recount from c)` in a WHERE is a one-time
	// filter, so the branch it turns off is never run.
	const recount = exact ? `c as materialized (select ${recountSql(p, kept)} as recount),` : '';
	let ctes: string;
	if (searchTerms(q.q).length) {
		const matches = filterClauses(q, ctx, p, true, asTyped);
		matches.push('(select recount from c)');
		const stage = q.stage.length ? `where ${stageClause(q, p, 'm')}` : '';
		let alone: string;
		if (known.page) {
			// The page's leads by number, when the matches are kept with the facets (runList).
			alone = `select l.id, ${key} as k, l.number from leads l
			where l.number = any(${p.add(known.page)}::int[]) and not (select recount from c)`;
		} else {
			// The page alone, when the facets are kept: the stage filter joins the tsquery of a
			// word search, so the GIN scan yields the page's stages only.
			const clauses = filterClauses(q, ctx, p, true, asTyped, true);
			if (q.stage.length && !searchParts(q.q, asTyped).words) clauses.push(stageClause(q, p, 'l'));
			clauses.push('not (select recount from c)');
			alone = `select l.id, ${key} as k, l.number from leads l ${where(clauses)}
			order by k ${dir}, number ${dir} ${paging()}`;
		}
		// Every match in the view's order, when there are few enough to keep: the next pages and
		// stage chips of the view then read only their leads, by number. One int per match, the
		// lead number times 8 plus its stage (1 to 7, in STAGES order): half the time of pairs.
		// The list is made (an InitPlan, run only when its CASE branch is) only under the limit.
		const stageIndex = `case stage ${STAGES.map((st, i) => `when '${st}' then ${i + 1}`).join(' ')} end`;
		ctes = `${recount}
	m as materialized (
		select l.id, l.stage, l.number, ${key} as k from leads l ${where(matches)}
	),
	f as (select stage, count(*)::int as n from m group by stage),
	mx as (
		select case when (select sum(n) from f) <= ${KEPT_MATCHES} then (
			select array_agg(number * 8 + ${stageIndex} order by k ${dir}, number ${dir}) from m
		) end as matches
	),
	pg as (
		(select id, k, number from m ${stage} order by k ${dir}, number ${dir} ${paging()})
		union all
		(${alone})
	)`;
	} else {
		let facets = countedFacets(q, ctx, p);
		if (!facets) {
			const clauses = filterClauses(q, ctx, p);
			clauses.push('(select recount from c)');
			facets = `select l.stage, count(*)::int as n from leads l ${where(clauses)} group by l.stage`;
		}
		const clauses = filterClauses(q, ctx, p);
		if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
		const order = `order by ${key} ${dir}, l.number ${dir}`;
		const page = `select l.id, ${key} as k, l.number from leads l`;
		const start = known.start;
		if (start) {
			// A deep page whose start an earlier answer found: while no lead has changed since, it
			// is the `size` rows from that key on (a seek in the sort's index), not `offset` rows
			// skipped. Otherwise no rows, and `_sought` false: the caller asks again by offset.
			// (An offset branch here would make PostgreSQL plan every execution again, see above.)
			const op = (dir === 'desc' ? '<' : '>') + (start.inclusive ? '=' : '');
			const bound = `(${key}, l.number) ${op} (${p.add(start.key)}::${KEY_TYPE[q.sort]}, ${p.add(start.number)}::int)`;
			const sought = [...clauses, bound, 'not (select stale from s)'];
			ctes = `${recount}
	s as materialized (select ${recountSql(p, start.snapshot)} as stale),
	f as (${facets}),
	pg as (${page} ${where(sought)} ${order} ${limit})`;
		} else {
			ctes = `${recount}
	f as (${facets}),
	pg as (${page} ${where(clauses)} ${order} ${paging()})`;
		}
	}
	const counted = exact ? '(select recount from c)' : 'true';
	// The matches (a list of thousands) on the first row only, not on every row of the page.
	// Not for dates: their views are not kept (see facetsKey), so neither is the list (`mx`, when
	// not referenced, is not run).
	const keepsMatches = searchTerms(q.q).length > 0 && !q.from && !q.to;
	const matchList = keepsMatches ? '(select matches from mx)' : 'null::int[]';
	const text = `with ${ctes},
	fx as (
		select coalesce(json_object_agg(stage, n), '{}'::json) as "_facets",
			${counted} as "_counted", pg_current_snapshot()::text as "_snapshot",
			${matchList} as "_matches",
			${known.start && !searchTerms(q.q).length ? 'not (select stale from s)' : 'null::bool'} as "_sought"
		from f
	),
	r as (select pg.k as "_k", pg.k::text as "_key", ${ROW_COLUMNS} from pg join leads l on l.id = pg.id ${ROW_JOINS})
	select fx."_facets", fx."_counted", fx."_snapshot", fx."_sought",
		case when row_number() over w = 1 then fx."_matches" end as "_matches", r.*
	from fx left join r on true
	window w as (order by r."_k" ${dir}, r.number ${dir})
	order by r."_k" ${dir}, r.number ${dir}`;
	return { text, params: p.values };
}
