// csvCell ($lib/csv) as SQL, for exports whose cells PostgreSQL writes while the rows stream:
// the same rules, from the same regular expressions (their sources mean the same in
// PostgreSQL's regular expressions), so the two cannot drift apart.
import { csvCell, FORMULA_START, NEEDS_QUOTES, NEEDS_RULES } from '$lib/csv';

/** Adds a statement parameter and returns its placeholder (`$n`). */
export type AddParam = (value: unknown) => string;

/** Writes cells in one statement; its patterns are three parameters, added when first needed. */
export class CsvCellsSql {
	private patterns?: { rules: string; formula: string; quotes: string };

	constructor(private readonly add: AddParam) {}

	private get pattern() {
		this.patterns ??= {
			rules: this.add(NEEDS_RULES.source),
			formula: this.add(FORMULA_START.source),
			quotes: this.add(NEEDS_QUOTES.source)
		};
		return this.patterns;
	}

	/**
	 * The cell of a text expression, as csvCell writes it: '' for null; a formula start gets an
	 * apostrophe; a comma, quote, CR or LF quotes the cell. Most values match neither pattern, and
	 * cost one regular expression test.
	 */
	cell(text: string): string {
		const x = `(${text})`;
		const { rules, formula, quotes } = this.pattern;
		const neutral = `case when ${x} ~ ${formula} then '''' || ${x} else ${x} end`;
		return `coalesce(case when ${x} ~ ${rules} then
			case when ${x} ~ ${quotes} then '"' || replace(${neutral}, '"', '""') || '"'
			else '''' || ${x} end
		else ${x} end, '')`;
	}

	/**
	 * The cell of a key's label, as `csvCell(label(labels, key))` writes it: each label's cell is
	 * made here once and passed as a parameter; any other key is written in words.
	 */
	labelCell(key: string, labels: Record<string, string>): string {
		const x = `(${key})::text`;
		const known = Object.entries(labels).map(
			([k, text]) => `when ${this.add(k)} then ${this.add(csvCell(text))}`
		);
		return `case ${x} ${known.join(' ')} else ${this.cell(`replace(${x}, '_', ' ')`)} end`;
	}

	/**
	 * The cell of an enum: its values are all known, so when none of them needs a rule (the usual
	 * case) the text is its cell, and no regular expression runs.
	 */
	enumCell(value: string, values: readonly string[]): string {
		if (values.every((v) => csvCell(v) === v)) return `coalesce((${value})::text, '')`;
		return this.labelCell(value, Object.fromEntries(values.map((v) => [v, v])));
	}
}
