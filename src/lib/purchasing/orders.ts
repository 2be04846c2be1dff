// Purchase orders from a job's materials list: one per supplier, priced at the price list's
// cost, and whether what they bring arrives before the install day. Pure: runs anywhere.
import { roundCents } from '$lib/estimating/pricing';

export interface OrderableMaterial {
	id: string;
	sku: string;
	name: string;
	description: string;
	unit: string;
	quantity: number;
}

export interface DraftLine {
	materialId: string;
	sku: string;
	description: string;
	unit: string;
	quantity: number;
	unitCostCents: number;
	extendedCents: number;
}

export interface DraftOrder {
	supplierId: string;
	lines: DraftLine[];
	totalCents: number;
}

/**
 * Groups the materials by their item's supplier. Lines with no supplier (or a removed or zero
 * quantity) are left out and returned apart, so the office can name a supplier for them.
 * Each line is rounded once to the cent (the estimate engine's rule); the total is their sum.
 */
export function draftOrders(
	materials: readonly OrderableMaterial[],
	supplierOf: (sku: string) => string | undefined,
	unitCostOf: (sku: string) => number
): { orders: DraftOrder[]; withoutSupplier: OrderableMaterial[] } {
	const orders = new Map<string, DraftLine[]>();
	const withoutSupplier: OrderableMaterial[] = [];
	for (const m of materials) {
		if (!(m.quantity > 0)) continue;
		const supplierId = supplierOf(m.sku);
		if (!supplierId) {
			withoutSupplier.push(m);
			continue;
		}
		const unitCostCents = unitCostOf(m.sku);
		const lines = orders.get(supplierId) ?? [];
		lines.push({
			materialId: m.id,
			sku: m.sku,
			description: m.description ? `${m.name} (${m.description})` : m.name,
			unit: m.unit,
			quantity: m.quantity,
			unitCostCents,
			extendedCents: roundCents(m.quantity * unitCostCents)
		});
		orders.set(supplierId, lines);
	}
	return {
		orders: [...orders].map(([supplierId, lines]) => ({
			supplierId,
			lines,
			totalCents: lines.reduce((s, l) => s + l.extendedCents, 0)
		})),
		withoutSupplier
	};
}

export const orderTotal = (lines: readonly { extendedCents: number }[]) =>
	lines.reduce((s, l) => s + l.extendedCents, 0);

/**
 * Whether an order will not arrive before the install day: no expected date yet, or expected on
 * the day itself or later (the crew needs it on site when they start). Dates are yyyy-mm-dd.
 */
export function arrivesLate(expectedOn: string | null, firstInstallDay: string): boolean {
	return expectedOn === null || expectedOn >= firstInstallDay;
}
