// The weekly-hours grid of the availability form: fields named `weeklyHours.<day>.<n>.start`
// and `.end` (day 0 = Sunday, up to two spans a day), so zod's error paths name the field.
export const WEEKDAYS = [
	'Sunday',
	'Monday',
	'Tuesday',
	'Wednesday',
	'Thursday',
	'Friday',
	'Saturday'
] as const;
export const SPANS_PER_DAY = 2;

export function fieldName(day: number, span: number, edge: 'start' | 'end'): string {
	return `weeklyHours.${day}.${span}.${edge}`;
}

type Span = { start: string; end: string };

/**
 * Spans with a start or an end typed (a day with none is a day off), and for each kept span the
 * form row it came from, so an error on a later row still lands beside that row.
 */
export function hoursFromForm(data: FormData): {
	hours: Record<string, Span[]>;
	row: (path: string) => string;
} {
	const hours: Record<string, Span[]> = {};
	const rows = new Map<string, number>();
	for (let day = 0; day < 7; day++) {
		const spans: Span[] = [];
		for (let span = 0; span < SPANS_PER_DAY; span++) {
			const start = String(data.get(fieldName(day, span, 'start')) ?? '').trim();
			const end = String(data.get(fieldName(day, span, 'end')) ?? '').trim();
			if (start || end) {
				rows.set(`${day}.${spans.length}`, span);
				spans.push({ start, end });
			}
		}
		if (spans.length) hours[String(day)] = spans;
	}
	const row = (path: string) =>
		path.replace(/^weeklyHours\.(\d)\.(\d)\./, (_m, d: string, i: string) => {
			return `weeklyHours.${d}.${rows.get(`${d}.${i}`) ?? i}.`;
		});
	return { hours, row };
}

const minutes = (clock: string) => Number(clock.slice(0, 2)) * 60 + Number(clock.slice(3, 5));

/** Two spans of one day that overlap or come out of order: the error goes on the later one. */
export function overlapErrors(hours: Record<string, Span[]>): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [day, spans] of Object.entries(hours)) {
		for (let i = 1; i < spans.length; i++) {
			if (minutes(spans[i].start) < minutes(spans[i - 1].end)) {
				out[`weeklyHours.${day}.${i}.start`] = 'Start this span after the one before ends';
			}
		}
	}
	return out;
}
