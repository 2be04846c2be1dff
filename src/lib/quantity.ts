// Quantities as people read them on pages, change orders and purchase orders: a whole number as
// it is ("12"), a fraction with at most two decimals and thousands separators ("1,234.5",
// "2.25"). Pure: the browser and the server (the purchase order PDF) share it.

const fraction = new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 });

/** 12 → "12", 2.5 → "2.5", 1234.5 → "1,234.5", −1 → "-1". */
export function formatQuantity(q: number): string {
	return Number.isInteger(q) ? String(q) : fraction.format(q);
}
