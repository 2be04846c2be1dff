// Pump models in CSV: one pump a row; its curve in one cell, "flow:head" points in US gallons
// per hour and feet of head separated by ";", flow rising and head never rising.
import { z } from 'zod';
import { centsToDollarText, formatCents } from '$lib/money';
import { dollarsCell, idCell, issues, nameCell, toCsv, type RowBase } from './csv-cells';

export const PUMP_COLUMNS = ['pump_id', 'name', 'watts', 'price', 'cost', 'curve_gph_ft'] as const;

export interface PumpRecord {
	id: string;
	name: string;
	watts: number;
	priceCents: number;
	costCents: number | null;
	curve: { flowGph: number; headFt: number }[];
}

export interface PumpRowResult extends RowBase {
	pump?: PumpRecord;
}

const MAX_CURVE_POINTS = 40;

/** "flow:head;flow:head…" in gph and ft: at least two points, flow rising, head never rising. */
export const curveCell = z
	.string()
	.trim()
	.min(1, 'curve_gph_ft is empty')
	.transform((text, ctx) => {
		const fail = (message: string) => {
			ctx.addIssue({ code: 'custom', message: `curve_gph_ft: ${message}` });
			return z.NEVER;
		};
		const parts = text
			.split(';')
			.map((p) => p.trim())
			.filter(Boolean);
		if (parts.length > MAX_CURVE_POINTS) return fail(`at most ${MAX_CURVE_POINTS} points`);
		const points: { flowGph: number; headFt: number }[] = [];
		for (const [i, part] of parts.entries()) {
			const pair = part.split(':').map((n) => (n.trim() === '' ? NaN : Number(n)));
			if (pair.length !== 2 || pair.some((n) => !Number.isFinite(n))) {
				return fail(`point ${i + 1} “${part}” is not flow:head, such as 600:7.4`);
			}
			const [flowGph, headFt] = pair;
			if (flowGph < 0 || headFt < 0) return fail(`point ${i + 1} “${part}” is negative`);
			if (flowGph > 1e6 || headFt > 1e4) return fail(`point ${i + 1} “${part}” is too large`);
			const prev = points[i - 1];
			if (prev && flowGph <= prev.flowGph) {
				return fail(`point ${i + 1} “${part}”: flow must be higher than the point before`);
			}
			if (prev && headFt > prev.headFt) {
				return fail(`point ${i + 1} “${part}”: head must not be higher than the point before`);
			}
			points.push({ flowGph, headFt });
		}
		if (points.length < 2) return fail('a curve needs at least two points');
		return points;
	});

const pumpRowSchema = z.object({
	pump_id: idCell('pump_id'),
	name: nameCell,
	watts: z
		.string()
		.trim()
		.regex(/^\d{1,6}$/, 'watts must be a whole number above zero, such as 85')
		.transform(Number)
		.refine((w) => w > 0 && w <= 100_000, 'watts must be above 0 and at most 100000'),
	price: dollarsCell('price', '240.00'),
	cost: z.preprocess(
		(v) => (String(v ?? '').trim() === '' ? null : v),
		dollarsCell('cost', '130.00').nullable()
	),
	curve_gph_ft: curveCell
});

export const curveText = (curve: readonly { flowGph: number; headFt: number }[]) =>
	curve.map((p) => `${p.flowGph}:${p.headFt}`).join(';');

export function rowToPump(cells: Record<string, string>, line: number): PumpRowResult {
	const key = (cells.pump_id ?? '').trim();
	const parsed = pumpRowSchema.safeParse(cells);
	if (!parsed.success) {
		const errors = issues(parsed.error);
		return { line, key, label: '', detail: '', errors };
	}
	const r = parsed.data;
	const pump: PumpRecord = {
		id: r.pump_id,
		name: r.name,
		watts: r.watts,
		priceCents: r.price,
		costCents: r.cost,
		curve: r.curve_gph_ft
	};
	const last = pump.curve[pump.curve.length - 1];
	return {
		line,
		key,
		label: pump.name,
		detail: `${formatCents(pump.priceCents)}, ${pump.watts} W, ${pump.curve.length} points up to ${last.flowGph} gph`,
		errors: [],
		pump
	};
}

export function pumpsToCsv(pumps: readonly PumpRecord[]): string {
	return toCsv([
		PUMP_COLUMNS,
		...pumps.map((p) => [
			p.id,
			p.name,
			p.watts,
			centsToDollarText(p.priceCents),
			p.costCents === null ? '' : centsToDollarText(p.costCents),
			curveText(p.curve)
		])
	]);
}
