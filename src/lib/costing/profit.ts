// Did the job make money: estimated against actual labor, materials and other costs, and the
// profit and margin, in integer cents. Pure: the server feeds it rows; the page and the CSV show it.
//
// Rounding follows the estimate engine's rule (src/lib/estimating/pricing.ts): every money amount
// is rounded once, to the nearest cent with halves up, when it is computed; totals are sums of
// amounts already rounded, so the figures on the page always add up.
import { roundCents } from '$lib/estimating/pricing';

export interface TaskInput {
	id: string;
	name: string;
	estimatedHours: number;
	actualMinutes: number;
}

export interface MaterialInput {
	id: string;
	name: string;
	unit: string;
	/** The quantity on the job's materials list (the estimate's takeoff, plus change orders). */
	quantity: number;
	/** What the estimate counted this line to cost the firm. */
	estimatedCostCents: number;
	picked: number;
	returned: number;
	invoiceCostCents: number | null;
}

export interface CostingInput {
	/** What the homeowner accepted, tax included (jobs.contract_cents). */
	contractCents: number;
	/** The tax inside the contract: collected for the state, not the firm's revenue. */
	taxCents: number;
	/** Approved change orders, signed. */
	changeOrdersCents: number;
	paymentsCents: number;
	laborCostPerHourCents: number;
	tasks: readonly TaskInput[];
	/** Minutes worked on warranty callbacks of the job. */
	callbackMinutes: number;
	materials: readonly MaterialInput[];
	otherCosts: readonly { kind: 'equipment' | 'other'; amountCents: number }[];
	/** A task stands out when its hours exceed the estimate by more than this share. */
	overrunPercent: number;
}

export type MaterialBasis = 'invoice' | 'used' | 'estimate';

export interface TaskRow {
	id: string;
	name: string;
	estimatedHours: number;
	actualHours: number;
	/** (actual − estimated) ÷ estimated, in percent; null for a task the estimate did not have. */
	overPercent: number | null;
	standsOut: boolean;
}

export interface MaterialRow {
	id: string;
	name: string;
	unit: string;
	quantity: number;
	used: number;
	estimatedCostCents: number;
	actualCostCents: number;
	basis: MaterialBasis;
}

export interface Costing {
	tasks: TaskRow[];
	labor: {
		estimatedHours: number;
		actualHours: number;
		estimatedCents: number;
		actualCents: number;
		callbackHours: number;
		callbackCents: number;
	};
	materials: { rows: MaterialRow[]; estimatedCents: number; actualCents: number };
	equipmentCents: number;
	otherCents: number;
	revenueCents: number;
	changeOrdersCents: number;
	paymentsCents: number;
	outstandingCents: number;
	estimatedCostCents: number;
	estimatedProfitCents: number;
	actualCostCents: number;
	profitCents: number;
	/** Profit ÷ revenue in hundredths of a percent (1234 = 12.34 %); null without revenue. */
	marginBasisPoints: number | null;
	estimatedMarginBasisPoints: number | null;
}

/** Half up, like the engine's cents; for a ratio in hundredths of a percent. */
export function basisPoints(part: number, whole: number): number | null {
	if (whole === 0) return null;
	return Math.floor((part * 10_000) / whole + 0.5 + 1e-9);
}

const sum = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

export function laborCents(minutes: number, costPerHourCents: number): number {
	return roundCents((minutes * costPerHourCents) / 60);
}

function materialRow(m: MaterialInput): MaterialRow {
	const used = Math.max(0, m.picked - m.returned);
	const touched = m.picked > 0 || m.returned > 0;
	let actual: number;
	let basis: MaterialBasis;
	if (m.invoiceCostCents !== null) {
		actual = m.invoiceCostCents;
		basis = 'invoice';
	} else if (touched && m.quantity > 0) {
		// The estimate's cost for each unit, for the quantity really used.
		actual = roundCents((used * m.estimatedCostCents) / m.quantity);
		basis = 'used';
	} else {
		actual = m.estimatedCostCents;
		basis = 'estimate';
	}
	return {
		id: m.id,
		name: m.name,
		unit: m.unit,
		quantity: m.quantity,
		used: touched ? used : m.quantity,
		estimatedCostCents: m.estimatedCostCents,
		actualCostCents: actual,
		basis
	};
}

export function jobCosting(input: CostingInput): Costing {
	const tasks = input.tasks.map((t) => {
		const actualHours = t.actualMinutes / 60;
		const overPercent =
			t.estimatedHours > 0 ? ((actualHours - t.estimatedHours) / t.estimatedHours) * 100 : null;
		return {
			id: t.id,
			name: t.name,
			estimatedHours: t.estimatedHours,
			actualHours,
			overPercent,
			standsOut: overPercent !== null && overPercent > input.overrunPercent
		};
	});
	const estimatedHours = sum(input.tasks.map((t) => t.estimatedHours));
	const actualMinutes = sum(input.tasks.map((t) => t.actualMinutes));
	const labor = {
		estimatedHours,
		actualHours: actualMinutes / 60,
		estimatedCents: roundCents(estimatedHours * input.laborCostPerHourCents),
		actualCents: laborCents(actualMinutes, input.laborCostPerHourCents),
		callbackHours: input.callbackMinutes / 60,
		callbackCents: laborCents(input.callbackMinutes, input.laborCostPerHourCents)
	};
	const rows = input.materials.map(materialRow);
	const materials = {
		rows,
		estimatedCents: sum(rows.map((r) => r.estimatedCostCents)),
		actualCents: sum(rows.map((r) => r.actualCostCents))
	};
	const equipmentCents = sum(
		input.otherCosts.filter((c) => c.kind === 'equipment').map((c) => c.amountCents)
	);
	const otherCents = sum(
		input.otherCosts.filter((c) => c.kind === 'other').map((c) => c.amountCents)
	);
	const revenueCents = input.contractCents - input.taxCents + input.changeOrdersCents;
	const estimatedCostCents = labor.estimatedCents + materials.estimatedCents;
	const actualCostCents =
		labor.actualCents + labor.callbackCents + materials.actualCents + equipmentCents + otherCents;
	const profitCents = revenueCents - actualCostCents;
	const estimatedProfitCents = revenueCents - estimatedCostCents;
	return {
		tasks,
		labor,
		materials,
		equipmentCents,
		otherCents,
		revenueCents,
		changeOrdersCents: input.changeOrdersCents,
		paymentsCents: input.paymentsCents,
		outstandingCents: input.contractCents + input.changeOrdersCents - input.paymentsCents,
		estimatedCostCents,
		estimatedProfitCents,
		actualCostCents,
		profitCents,
		marginBasisPoints: basisPoints(profitCents, revenueCents),
		estimatedMarginBasisPoints: basisPoints(estimatedProfitCents, revenueCents)
	};
}

/** 1234 → "12.3 %"; null → "—". */
export function formatMargin(bp: number | null): string {
	if (bp === null) return '—';
	return `${(bp / 100).toFixed(1)} %`;
}
