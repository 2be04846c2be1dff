export const money = (cents: number) =>
	(cents < 0 ? '−$' : '$') +
	(Math.abs(cents) / 100).toLocaleString('en-US', {
		minimumFractionDigits: 2,
		maximumFractionDigits: 2
	});

/** A yyyy-mm-dd day as "Mon 7 Jun", read as a calendar date (no time zone shift). */
export function dayLabel(day: string): string {
	const [y, m, d] = day.split('-').map(Number);
	return new Date(Date.UTC(y, m - 1, d)).toLocaleDateString('en-US', {
		weekday: 'short',
		day: 'numeric',
		month: 'short',
		timeZone: 'UTC'
	});
}

export const STAGES = {
	scheduled: 'Scheduled',
	underway: 'Underway',
	punch_list: 'Punch list',
	complete: 'Complete',
	paid: 'Paid'
} as const;

export const quantity = (q: number) =>
	Number.isInteger(q) ? String(q) : q.toLocaleString('en-US', { maximumFractionDigits: 2 });
