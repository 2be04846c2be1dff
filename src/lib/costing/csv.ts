// The completed jobs' margins as CSV (the same cell rules as every export: $lib/csv.ts).
import { csvLine } from '$lib/csv';

export interface MarginRow {
	number: number;
	title: string;
	homeowner: string;
	completedOn: string;
	revenueCents: number;
	costCents: number;
	profitCents: number;
	marginBasisPoints: number | null;
	estimatedHours: number;
	actualHours: number;
}

export const MARGIN_COLUMNS = [
	'job',
	'title',
	'homeowner',
	'completed_on',
	'revenue',
	'cost',
	'profit',
	'margin_percent',
	'estimated_hours',
	'actual_hours'
];

/** Cents as dollars with two decimals and no grouping, so a spreadsheet reads them as numbers. */
const dollars = (cents: number) =>
	`${cents < 0 ? '-' : ''}${Math.floor(Math.abs(cents) / 100)}.${String(Math.abs(cents) % 100).padStart(2, '0')}`;

export function marginsCsv(rows: readonly MarginRow[]): string {
	return (
		csvLine(MARGIN_COLUMNS) +
		rows
			.map((r) =>
				csvLine([
					`J-${r.number}`,
					r.title,
					r.homeowner,
					r.completedOn,
					dollars(r.revenueCents),
					dollars(r.costCents),
					dollars(r.profitCents),
					r.marginBasisPoints === null ? '' : (r.marginBasisPoints / 100).toFixed(2),
					r.estimatedHours.toFixed(2),
					r.actualHours.toFixed(2)
				])
			)
			.join('')
	);
}
