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
 * the raw values of EXPORT_COLUMNS as the JSON text of one array per row (a single string per row
 * in the app, parsed only when its line is written: rows waiting in a batch are then one object
 * each, not sixteen, so few outlive the server's young generation). Times come as whole minutes
 * since 1970: no timestamp text to parse and no Date per cell; the office reads times to the
 * minute.
 *
 * PostgreSQL only joins, filters and sorts here; writing the cells is left to the app. The rows
 * are sorted raw and the JSON is made above the sort (the subquery with `offset 0` is a fence the
 * planner keeps), so that, like the app's writing, it is done batch by batch while the rows
 * stream, instead of for every row before the first one leaves.
 */
export function exportSql(q: LeadQuery, ctx: ListContext): Statement {
	const p = new Params();
	const clauses = filterClauses(q, ctx, p);
	if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	// floor(epoch / 60): the minute a time falls in, as date_trunc('minute') would give in any
	// zone whose offset is whole minutes, without its time zone work.
	const minutes = (column: string) => `floor(date_part('epoch', s.${column}) / 60)::int4`;
	const raw = [
		`${SORT_SQL[q.sort]} as k`,
		'l.number',
		'l.created_at',
		'c.name',
		'c.email',
		'c.phone',
		'p.town',
		'l.services',
		'l.budget',
		'l.stage',
		'l.close_reason',
		'u.name as assignee',
		'l.priority',
		'l.source',
		'l.first_reply_at',
		'l.last_touch_at'
	];
	const columns = [
		's.number',
		minutes('created_at'),
		's.name',
		's.email',
		's.phone',
		's.town',
		's.services',
		's.budget',
		's.stage::text',
		's.close_reason::text',
		's.assignee',
		's.priority::text',
		's.source',
		minutes('first_reply_at'),
		minutes('last_touch_at')
	];
	const order = (k: string, number: string) => `order by ${k} ${dir}, ${number} ${dir}`;
	const text = `/* leads export */ select json_build_array(${columns.join(', ')})::text
		from (
			select ${raw.join(', ')} from leads l ${ROW_JOINS} ${where(clauses)}
			${order(SORT_SQL[q.sort], 'l.number')} offset 0
		) s
		${order('s.k', 's.number')}`;
	return { text, params: p.values };
}
