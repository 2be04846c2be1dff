// The SQL of the leads CSV export: every row of a filtered view, in the view's order, its cells
// written by PostgreSQL where it can.
import { BUDGET_LABELS, STAGE_LABELS, type LeadQuery } from '../../schema/leads';
import { CsvCellsSql } from '../platform/csv-sql';
import { closeReasonEnum, priorityEnum } from '../platform/db/schema/leads';
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
 * Every row of a filtered view (no paging, no facets), for the CSV export, in the view's order.
 * PostgreSQL writes the cells (csvCell's rules as SQL, labels made once in the app), so a row
 * reaches the app as its line in pieces (ExportRow): the finished text around the cells the app
 * writes itself, the times in the firm's zone and the services' labels. Times come as whole
 * minutes since 1970: no timestamp text to parse and no Date per cell; the office reads times
 * to the minute.
 *
 * The rows are sorted raw and the cells are made above the sort (the subquery with `offset 0` is
 * a fence the planner keeps), so that, like the app's writing, they are made batch by batch
 * while the rows stream, instead of for every row before the first one leaves.
 */
export function exportSql(q: LeadQuery, ctx: ListContext): Statement {
	const p = new Params();
	const clauses = filterClauses(q, ctx, p);
	if (q.stage.length) clauses.unshift(stageClause(q, p, 'l'));
	const dir = q.dir === 'asc' ? 'asc' : 'desc';
	const csv = new CsvCellsSql((v) => p.add(v));
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
	const cells = (texts: string[]) => `',' || ${texts.join(` || ',' || `)} || ','`;
	const columns = [
		`'R-' || s.number || ','`,
		minutes('created_at'),
		cells(['s.name', 's.email', 's.phone', 's.town'].map((x) => csv.cell(x))),
		'array_to_json(s.services)::text',
		cells([
			csv.labelCell('s.budget', BUDGET_LABELS),
			csv.labelCell('s.stage', STAGE_LABELS),
			csv.enumCell('s.close_reason', closeReasonEnum.enumValues),
			csv.cell('s.assignee'),
			csv.enumCell('s.priority', priorityEnum.enumValues),
			csv.cell('s.source')
		]),
		minutes('first_reply_at'),
		minutes('last_touch_at')
	];
	const order = (k: string, number: string) => `order by ${k} ${dir}, ${number} ${dir}`;
	const text = `/* leads export */ select ${columns.join(', ')}
		from (
			select ${raw.join(', ')} from leads l ${ROW_JOINS} ${where(clauses)}
			${order(SORT_SQL[q.sort], 'l.number')} offset 0
		) s
		${order('s.k', 's.number')}`;
	return { text, params: p.values };
}
