// The SQL of the leads CSV export: every row of a filtered view, raw, in the view's order.
import type { LeadQuery } from '../../schema/leads';
import {
	filterClauses,
	Params,
	ROW_JOINS,
	SORT_SQL,
	stageClause,
	where,
	type ListContext,
	type Statement
} from './list-sql';

/** The export's columns, in the file's order. */
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

/**
 * Every row of a filtered view (no paging, no facets), for the CSV export, in the view's order:
 * the raw values of EXPORT_COLUMNS, as one JSON array per row (one value to parse instead of
 * fifteen), which the app writes as CSV (export-lines.ts). Times come as whole minutes since 1970:
 * no timestamp text to parse and no Date per cell; the office reads times to the minute.
 *
 * PostgreSQL only joins, filters and sorts here; writing the cells is left to the app, which
 * does it on the other core while PostgreSQL sends the next batch.
 */
export function exportSql(q: LeadQuery, ctx: ListContext): Statement {
	const p = new Params();
	const clauses = filterClauses(q, ctx, p);
	if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	const minutes = (column: string) =>
		`(date_part('epoch', date_trunc('minute', ${column})) / 60)::int4`;
	const columns = [
		'l.number',
		minutes('l.created_at'),
		'c.name',
		'c.email',
		'c.phone',
		'p.town',
		'l.services',
		'l.budget',
		'l.stage::text',
		'l.close_reason::text',
		'u.name',
		'l.priority::text',
		'l.source',
		minutes('l.first_reply_at'),
		minutes('l.last_touch_at')
	];
	const text = `/* leads export */ select json_build_array(${columns.join(', ')})
		from leads l ${ROW_JOINS} ${where(clauses)}
		order by ${SORT_SQL[q.sort]} ${dir}, l.number ${dir}`;
	return { text, params: p.values };
}
