// The SQL of the leads CSV export: every row of a filtered view, each already a CSV line.
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
 * each lead's CSV line (columns of EXPORT_COLUMNS, CRLF at the end), in the view's order.
 * PostgreSQL writes the times as the office reads them ("Dec 3, 5:14 PM" in the firm's time zone,
 * as `formatWhen` writes them) and the labels from the maps given, quoting and formula
 * neutralising as `csvLine`. Streaming 100,000 rows then costs the app one string per row, no
 * Date object and no formatter. Times always hold a comma and start with a month, so they come
 * quoted without the cell rules.
 *
 * The inner query joins, filters and sorts the raw columns only; the middle one makes the cells
 * (a fence, so that each is made once) and the outer one the line. Sorting first lets PostgreSQL
 * hand out the first batch as soon as the sort is done and make the next batch while the app
 * writes the previous one, instead of making every cell before sorting.
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
	// A cell is SQL for its text, and whether that text is already CSV (else the cell rules apply).
	const asCsv = (sql: string) => ({ sql, isCsv: true });
	const asText = (sql: string) => ({ sql, isCsv: false });
	const quotedWhen = (key: keyof typeof raw) =>
		asCsv(
			`case when ${x(key)} is null then '' else '"' || to_char(${x(key)} at time zone ${tz}::text, 'Mon FMDD, FMHH12:MI AM') || '"' end`
		);
	const cells = [
		asCsv(`'R-' || ${x('number')}`),
		quotedWhen('created'),
		asText(x('name')),
		asText(x('email')),
		asText(x('phone')),
		asText(x('town')),
		asText(
			`array_to_string(array(select ${service} from unnest(${x('services')}) with ordinality as u(s, i) order by i), '; ')`
		),
		asText(labelSql(x('budget'), labels.budgets, p)),
		asText(labelSql(x('stage'), labels.stages, p)),
		asText(x('close')),
		asText(x('assignee')),
		asText(x('priority')),
		asText(x('source')),
		quotedWhen('firstReply'),
		quotedWhen('lastTouch')
	];
	const line = cells.map((c, i) => (c.isCsv ? `y.c${i}` : csvCellSql(`y.c${i}`)));
	const text = `/* leads export */ select ${line.join(` || ',' || `)} || chr(13) || chr(10) as line
	from (
		select ${cells.map((c, i) => `${c.sql} as c${i}`).join(', ')}
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
