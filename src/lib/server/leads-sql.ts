// The SQL of the leads list, with no SvelteKit imports: the app runs it, and so does the
// benchmark's bare node:http baseline (scripts/bench/leads.ts), so both measure the same queries.
import { BUDGETS, type LeadQuery } from '../schema/leads';

/** Days are the firm's days: the time zone comes from the settings row, inside the query. */
const FIRM_TZ = `(select time_zone from settings where id = 1)`;

export interface ListContext {
	userId: string;
}

const SORT_SQL: Record<LeadQuery['sort'], string> = {
	received: 'l.created_at',
	name: 'lower(c.name)',
	town: "lower(coalesce(p.town, ''))",
	stage: 'l.stage',
	budget: `coalesce(array_position(array[${BUDGETS.map((b) => `'${b.replace(/'/g, "''")}'`).join(',')}]::text[], l.budget), ${BUDGETS.length + 1})`,
	last_touch: 'l.last_touch_at'
};

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => '\\' + c);

/** Search terms: lower-cased words, each must appear somewhere in the lead's search text. */
export function searchTerms(q: string | undefined): string[] {
	if (!q) return [];
	return q.toLowerCase().split(/\s+/).filter(Boolean).slice(0, 6);
}

interface Where {
	clauses: string[];
	params: unknown[];
}

function whereOf(q: LeadQuery, ctx: ListContext, withStage: boolean): Where {
	const params: unknown[] = [];
	const p = (v: unknown) => {
		params.push(v);
		return `$${params.length}`;
	};
	const clauses: string[] = [];
	if (withStage && q.stage.length) clauses.push(`l.stage = any(${p(q.stage)}::lead_stage[])`);
	if (q.service.length) clauses.push(`l.services && ${p(q.service)}::text[]`);
	if (q.budget.length) clauses.push(`l.budget = any(${p(q.budget)}::text[])`);
	if (q.assignee === 'mine') clauses.push(`l.assignee_id = ${p(ctx.userId)}`);
	else if (q.assignee === 'unassigned') clauses.push('l.assignee_id is null');
	else if (q.assignee) clauses.push(`l.assignee_id = ${p(q.assignee)}`);
	if (q.from) {
		clauses.push(`l.created_at >= (${p(q.from)}::date::timestamp at time zone ${FIRM_TZ})`);
	}
	if (q.to) {
		clauses.push(`l.created_at < ((${p(q.to)}::date + 1)::timestamp at time zone ${FIRM_TZ})`);
	}
	if (q.awaiting) clauses.push(`l.first_reply_at is null and l.stage not in ('sold', 'closed')`);
	for (const term of searchTerms(q.q)) {
		clauses.push(`l.search_text like ${p(`%${escapeLike(term)}%`)}`);
	}
	return { clauses, params };
}

export interface ListSql {
	rows: { text: string; params: unknown[] };
	facets: { text: string; params: unknown[] };
}

/** The two statements of a list page; the benchmark's bare baseline runs exactly these. */
export function listSql(q: LeadQuery, ctx: ListContext, paged = true): ListSql {
	const w = whereOf(q, ctx, true);
	const where = w.clauses.length ? `where ${w.clauses.join(' and ')}` : '';
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	const order = `${SORT_SQL[q.sort]} ${dir}, l.number ${dir}`;
	const limit = paged ? ` limit ${q.size} offset ${(q.page - 1) * q.size}` : '';
	const rows = `select l.id, l.number, l.created_at as "createdAt", l.stage, l.services, l.budget,
		l.priority, l.source, l.first_reply_at as "firstReplyAt", l.last_touch_at as "lastTouchAt",
		l.close_reason as "closeReason", l.assignee_id as "assigneeId", u.name as "assigneeName",
		c.name, c.email, c.phone, p.town
	from leads l
	join contacts c on c.id = l.contact_id
	left join properties p on p.id = l.property_id
	left join users u on u.id = l.assignee_id
	${where}
	order by ${order}${limit}`;
	// Facets count every stage under the other filters, so the stage chips show what a click gives.
	const f = whereOf(q, ctx, false);
	const facets = `select l.stage, count(*)::int as n from leads l
	${f.clauses.length ? `where ${f.clauses.join(' and ')}` : ''}
	group by l.stage`;
	return { rows: { text: rows, params: w.params }, facets: { text: facets, params: f.params } };
}
