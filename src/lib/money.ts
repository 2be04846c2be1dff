// Money as people read and type it. Every amount is kept in integer cents; these turn cents into
// "$1,234.56" for pages, e-mails, PDFs and timeline entries, and typed dollars back into cents
// without passing through floating point. Pure: the browser and the server share it.

const thousands = (whole: number) => whole.toLocaleString('en-US');

/**
 * Cents as "$1,234.56"; a negative amount (a refund, a credit, a cut in a change order) as
 * "−$10.50" with the minus sign U+2212. Another currency (a provider reporting something else
 * than was asked) is written by the platform's own currency formatter, e.g. "€12.00".
 */
export function formatCents(cents: number, currency = 'usd'): string {
	if (currency.toLowerCase() !== 'usd') {
		return new Intl.NumberFormat('en-US', {
			style: 'currency',
			currency: currency.toUpperCase()
		}).format(cents / 100);
	}
	const abs = Math.abs(Math.round(cents));
	const sign = cents < 0 && abs > 0 ? '−' : '';
	return `${sign}$${thousands(Math.floor(abs / 100))}.${String(abs % 100).padStart(2, '0')}`;
}

/** Cents as the plain text a money field is filled with: 120407 → "1204.07" (no "$", no commas). */
export function centsToDollarText(cents: number): string {
	const abs = Math.abs(Math.round(cents));
	const sign = cents < 0 && abs > 0 ? '-' : '';
	return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`;
}

/** The same for an optional amount: an empty field for null or zero. */
export const centsToFieldText = (cents: number | null | undefined) =>
	cents ? centsToDollarText(cents) : '';

export interface ParseCentsOptions {
	/** The most digits before the point (7 by default: up to $9,999,999.99). */
	wholeDigits?: number;
}

/**
 * Dollars as typed ("1,234.50", "$80", " 12.5 ") → integer cents; null for anything else: an
 * empty field, a negative amount, more than two decimals, letters, or more whole digits than
 * allowed. No floating point on the way in: "0.29" is 29, never 28.999….
 */
export function parseCents(text: string, options: ParseCentsOptions = {}): number | null {
	const digits = options.wholeDigits ?? 7;
	const t = text.replace(/[\s,]/g, '').replace(/^\$/, '');
	const m = new RegExp(`^(\\d{1,${digits}})(?:\\.(\\d{1,2}))?$`).exec(t);
	if (!m) return null;
	return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'));
}
