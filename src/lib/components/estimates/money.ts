/** One way to show cents everywhere (builder, homeowner page, print, e-mail): $1,234.56. */
export function formatCents(cents: number): string {
	const sign = cents < 0 ? '−' : '';
	const abs = Math.abs(Math.round(cents));
	const dollars = Math.floor(abs / 100).toLocaleString('en-US');
	return `${sign}$${dollars}.${String(abs % 100).padStart(2, '0')}`;
}

/** "12.50" or "12" → 1250; anything else → null (no floats on the way in). */
export function parseDollars(text: string): number | null {
	const m = /^\s*\$?(\d{1,9})(?:\.(\d{1,2}))?\s*$/.exec(text.replace(/,/g, ''));
	if (!m) return null;
	return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'));
}

export const centsToDollarText = (cents: number) =>
	`${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
