export const quantity = (q: number) =>
	Number.isInteger(q) ? String(q) : q.toLocaleString('en-US', { maximumFractionDigits: 2 });
