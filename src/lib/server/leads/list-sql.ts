// The SQL of the leads list, with no SvelteKit imports: the app runs it, and so does the
// benchmark's bare node:http baseline (scripts/bench/leads.ts), so both measure the same queries
// (both prepared: `{ prepare: true }`) and shape the answer with the same function (assembleList).
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
//   facets are taken from that set.
import { BUDGETS, STAGES, type LeadQuery, type Stage } from '../../schema/leads';

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
const SORT_SQL: Record<LeadQuery['sort'], string> = {
	received: 'l.created_at',
	name: 'l.sort_name',
	town: 'l.sort_town',
	stage: 'l.stage',
	budget: `coalesce(array_position(array[${BUDGETS.map((b) => `'${b.replace(/'/g, "''")}'`).join(',')}]::text[], l.budget), ${BUDGETS.length + 1})`,
	last_touch: 'l.last_touch_at'
};

const ROW_COLUMNS = `l.id, l.number, l.created_at as "createdAt", l.stage, l.services, l.budget,
		l.priority, l.source, l.first_reply_at as "firstReplyAt", l.last_touch_at as "lastTouchAt",
		l.close_reason as "closeReason", l.assignee_id as "assigneeId", u.name as "assigneeName",
		c.name, c.email, c.phone, p.town`;

const ROW_JOINS = `join contacts c on c.id = l.contact_id
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

/** A word of a name, town or message: letters, maybe joined by apostrophes or hyphens. */
const WORD = /^[\p{L}\p{M}]+(?:['’-][\p{L}\p{M}]+)*$/u;

/**
 * How each term is searched. A word ("brookstone", "o'rourke", "saint-étienne") goes to full-text
 * search: each of its parts must begin a word of the lead (`search_words`, accents ignored), all
 * of them in one tsquery. Anything else (digits, "@", ".", "%"…: phone numbers and e-mail
 * fragments) must appear as typed in `search_text`, through the trigram index.
 * With `asTyped`, every term is a fragment: the second try of a word search that found nothing,
 * for words that are only part of a token of the simple parser, such as the "gmail" of an
 * e-mail address (listLeads).
 */
export function searchParts(
	q: string | undefined,
	asTyped = false
): { words: string | null; fragments: string[] } {
	const words: string[] = [];
	const fragments: string[] = [];
	for (const term of searchTerms(q)) {
		if (!asTyped && WORD.test(term)) words.push(...term.split(/['’-]/).map((part) => `${part}:*`));
		else fragments.push(term);
	}
	return { words: words.length ? words.join(' & ') : null, fragments };
}

/** Numbered parameters shared by every part of one statement. */
class Params {
	readonly values: unknown[] = [];
	add(v: unknown): string {
		this.values.push(v);
		return `$${this.values.length}`;
	}
}

const stageClause = (q: LeadQuery, p: Params, alias: string) =>
	`${alias}.stage = any(${p.add(q.stage)}::lead_stage[])`;

/** The filters other than stage, on leads `l`. */
function filterClauses(
	q: LeadQuery,
	ctx: ListContext,
	p: Params,
	search = true,
	asTyped = false
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
			const tsquery = `to_tsquery('public.rillstone_names', ${p.add(words)})`;
			clauses.push(
				q.service.length
					? `l.search_words @@ (${tsquery} && ${p.add(serviceQuery(q.service))}::tsquery)`
					: `l.search_words @@ ${tsquery}`
			);
		}
		for (const term of searchParts(q.q, asTyped).fragments) {
			clauses.push(`l.search_text like ${p.add(`%${escapeLike(term)}%`)}`);
		}
	}
	return clauses;
}

const where = (clauses: string[]) => (clauses.length ? `where ${clauses.join(' and ')}` : '');

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
 * The one statement of a list page: a row per lead of the page, each carrying the stage facets
 * (`_facets`) and its sort key (`_k`); a single row of nulls with the facets when the page is empty.
 * Facets count every stage under the other filters, so the stage chips show what a click gives.
 */
export function listSql(q: LeadQuery, ctx: ListContext, asTyped = false): Statement {
	const p = new Params();
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	// Parameters, not literals: the statement's text stays the same from page to page, so one
	// prepared statement (and its plan) serves every page of a view.
	const paging = `limit ${p.add(q.size)}::int offset ${p.add((q.page - 1) * q.size)}::int`;
	const key = SORT_SQL[q.sort];
	let ctes: string;
	if (searchTerms(q.q).length) {
		const matches = filterClauses(q, ctx, p, true, asTyped);
		const stage = q.stage.length ? `where ${stageClause(q, p, 'm')}` : '';
		ctes = `m as materialized (
		select l.id, l.stage, l.number, ${key} as k from leads l ${where(matches)}
	),
	f as (select stage, count(*)::int as n from m group by stage),
	pg as (select id, k, number from m ${stage} order by k ${dir}, number ${dir} ${paging})`;
	} else {
		const facets =
			countedFacets(q, ctx, p) ??
			`select l.stage, count(*)::int as n from leads l ${where(filterClauses(q, ctx, p))} group by l.stage`;
		const clauses = filterClauses(q, ctx, p);
		if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
		ctes = `f as (${facets}),
	pg as (
		select l.id, ${key} as k, l.number from leads l ${where(clauses)}
		order by ${key} ${dir}, l.number ${dir} ${paging}
	)`;
	}
	const text = `with ${ctes},
	fx as (select coalesce(json_object_agg(stage, n), '{}'::json) as "_facets" from f),
	r as (select pg.k as "_k", ${ROW_COLUMNS} from pg join leads l on l.id = pg.id ${ROW_JOINS})
	select fx."_facets", r.* from fx left join r on true
	order by r."_k" ${dir}, r.number ${dir}`;
	return { text, params: p.values };
}

/** The export's columns, in the file's order; times are formatted by PostgreSQL (see exportSql). */
export const EXPORT_COLUMNS = [
	'Number',
	'Received',
	'Name',
	'E-mail',
	'Phone',
	'Town',
	'Services',
	'Budget',
	'Stage',
	'Close reason',
	'Assignee',
	'Priority',
	'Source',
	'First reply',
	'Last touch'
] as const;

/** A key's label from two parallel arrays (parameters), as `label()` in $lib/schema/leads.ts. */
function labelSql(v: string, map: Record<string, string>, p: Params): string {
	const keys = p.add(Object.keys(map));
	const labels = p.add(Object.values(map));
	return `case when ${v} is null or ${v} = '' then '' else coalesce((${labels}::text[])[array_position(${keys}::text[], ${v})], replace(${v}, '_', ' ')) end`;
}

export interface ExportLabels {
	services: Record<string, string>;
	budgets: Record<string, string>;
	stages: Record<string, string>;
}

/**
 * A CSV cell in SQL, exactly as `csvCell` ($lib/csv.ts) writes a text value: a leading =, +, -,
 * @, tab or CR gets an apostrophe; a value with a quote, comma, CR or LF is quoted, quotes
 * doubled; null is empty. Most values need neither, so one regular expression lets them through
 * as they are. `v` must be cheap to repeat (a column).
 */
function csvCellSql(v: string): string {
	const safe = `case when left(${v}, 1) in ('=', '+', '-', '@', chr(9), chr(13)) then '''' || ${v} else ${v} end`;
	const needsQuotes = `strpos(${v}, '"') > 0 or strpos(${v}, ',') > 0 or strpos(${v}, chr(13)) > 0 or strpos(${v}, chr(10)) > 0`;
	const special = `${v} ~ '^[-=+@\\t\\r]|[",\\r\\n]'`;
	return `case when ${v} is null then '' when not (${special}) then ${v} when ${needsQuotes} then '"' || replace(${safe}, '"', '""') || '"' else ${safe} end`;
}

/**
 * Every row of a filtered view (no paging, no facets), for the CSV export: one column, `line`,
 * each lead's CSV line (columns of EXPORT_COLUMNS, CRLF at the end), in the view's order. PostgreSQL writes the times as the office reads them
 * ("Dec 3, 5:14 PM" in the firm's time zone, as `formatWhen` writes them) and the labels from the
 * maps given, quoting and formula neutralising as `csvLine`. Streaming 100,000 rows then costs
 * the app one string per row, no Date object and no formatter. Times always hold a comma and
 * start with a month, so they come quoted without the cell rules.
 *
 * The inner query joins, filters and sorts the raw columns only; the middle one makes the cells
 * (a fence, so that each is made once) and the outer one the line.
 * Sorting first lets PostgreSQL hand out the first batch as soon as the sort is done and make the
 * next batch while the app writes the previous one, instead of making every cell before sorting.
 */
export function exportSql(
	q: LeadQuery,
	ctx: ListContext,
	timeZone: string,
	labels: ExportLabels
): Statement {
	const p = new Params();
	const clauses = filterClauses(q, ctx, p);
	if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	const tz = p.add(timeZone);
	const service = labelSql('s', labels.services, p);
	const raw = {
		number: 'l.number',
		created: 'l.created_at',
		name: 'c.name',
		email: 'c.email',
		phone: 'c.phone',
		town: 'p.town',
		services: 'l.services',
		budget: 'l.budget',
		stage: 'l.stage::text',
		close: 'l.close_reason::text',
		assignee: 'u.name',
		priority: 'l.priority::text',
		source: 'l.source',
		firstReply: 'l.first_reply_at',
		lastTouch: 'l.last_touch_at'
	};
	const x = (key: keyof typeof raw) => `x."${key}"`;
	const quotedWhen = (key: keyof typeof raw) =>
		`case when ${x(key)} is null then '' else '"' || to_char(${x(key)} at time zone ${tz}::text, 'Mon FMDD, FMHH12:MI AM') || '"' end`;
	const cells = [
		`'R-' || ${x('number')}`,
		quotedWhen('created'),
		x('name'),
		x('email'),
		x('phone'),
		x('town'),
		`array_to_string(array(select ${service} from unnest(${x('services')}) with ordinality as u(s, i) order by i), '; ')`,
		labelSql(x('budget'), labels.budgets, p),
		labelSql(x('stage'), labels.stages, p),
		x('close'),
		x('assignee'),
		x('priority'),
		x('source'),
		quotedWhen('firstReply'),
		quotedWhen('lastTouch')
	];
	const isCsv = [0, 1, 13, 14];
	const line = cells.map((_, i) => (isCsv.includes(i) ? `y.c${i}` : csvCellSql(`y.c${i}`)));
	const text = `/* leads export */ select ${line.join(` || ',' || `)} || chr(13) || chr(10) as line
	from (
		select ${cells.map((c, i) => `${c} as c${i}`).join(', ')}
		from (
			select ${Object.entries(raw)
				.map(([key, column]) => `${column} as "${key}"`)
				.join(', ')}
			from leads l ${ROW_JOINS} ${where(clauses)}
			order by ${SORT_SQL[q.sort]} ${dir}, l.number ${dir}
			offset 0
		) x
		offset 0
	) y`;
	return { text, params: p.values };
}

const iso = (v: unknown) => new Date(v as string).toISOString();

/** A result row of listSql or exportSql as the API's row (times as ISO strings). */
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

/** The API's answer from the rows of listSql: the page, the facets per stage and the total. */
export function assembleList(q: LeadQuery, result: readonly Record<string, unknown>[]): LeadList {
	const facets = Object.fromEntries(STAGES.map((st) => [st, 0])) as Record<Stage, number>;
	const counted = (result[0]?._facets ?? {}) as Partial<Record<Stage, number>>;
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
