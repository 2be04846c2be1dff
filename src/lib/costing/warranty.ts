// The warranty period: a number of calendar months from the completion day. Pure; dates are
// yyyy-mm-dd calendar days in the firm's time zone.

/**
 * The last day covered: the completion day plus the months, the same day of the month (or
 * the month's last day when it has no such day: 31 Jan + 1 month → 28 or 29 Feb).
 */
export function warrantyEndsOn(completedOn: string, months: number): string {
	const [y, m, d] = completedOn.split('-').map(Number);
	const total = y * 12 + (m - 1) + months;
	const year = Math.floor(total / 12);
	const month = (total % 12) + 1;
	const last = new Date(Date.UTC(year, month, 0)).getUTCDate();
	const day = Math.min(d, last);
	return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/** Inside the warranty when reported on or before its last day. */
export function insideWarranty(reportedOn: string, endsOn: string): boolean {
	return reportedOn <= endsOn;
}
