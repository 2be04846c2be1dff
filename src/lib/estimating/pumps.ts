/** Pump curves, operating points against the system curve, the pump choice and running cost. */
import { systemHead, type SystemCoefficients } from './hydraulics';
import { roundCents } from './pricing';
import type { PumpModel, Settings } from './schema';
import { DAYS_PER_MONTH, feet, gph } from './units';

export interface CurvePoint {
	flowM3s: number;
	headM: number;
}

export interface PumpCurve {
	points: CurvePoint[];
	/** Fritsch–Carlson slopes at each point, dHead/dFlow. */
	slopes: number[];
}

/** A curve is usable when flow strictly rises and head never rises. Returns the bad index. */
export function firstNonMonotoneIndex(points: readonly { flowGph: number; headFt: number }[]) {
	for (let i = 1; i < points.length; i++) {
		if (points[i].flowGph <= points[i - 1].flowGph || points[i].headFt > points[i - 1].headFt) {
			return i;
		}
	}
	return -1;
}

/**
 * Monotone piecewise cubic Hermite slopes (F. N. Fritsch and R. E. Carlson, "Monotone Piecewise
 * Cubic Interpolation", SIAM J. Numer. Anal. 17(2), 1980), in the harmonic-mean form used by
 * Fritsch and Butland (1984), which never overshoots monotone data.
 */
export function monotoneSlopes(xs: readonly number[], ys: readonly number[]): number[] {
	const n = xs.length;
	const secants = xs.slice(1).map((x, i) => (ys[i + 1] - ys[i]) / (x - xs[i]));
	if (n === 2) return [secants[0], secants[0]];
	const slopes = new Array<number>(n).fill(0);
	for (let i = 1; i < n - 1; i++) {
		const [a, b] = [secants[i - 1], secants[i]];
		if (a * b <= 0) continue;
		const [h0, h1] = [xs[i] - xs[i - 1], xs[i + 1] - xs[i]];
		const [w0, w1] = [2 * h1 + h0, h1 + 2 * h0];
		slopes[i] = (w0 + w1) / (w0 / a + w1 / b);
	}
	slopes[0] = endSlope(secants[0], secants[1], xs[1] - xs[0], xs[2] - xs[1]);
	slopes[n - 1] = endSlope(
		secants[n - 2],
		secants[n - 3],
		xs[n - 1] - xs[n - 2],
		xs[n - 2] - xs[n - 3]
	);
	return slopes;
}

// Three-point end formula, limited to keep the end monotone (Moler, Numerical Computing with
// MATLAB, 2004, section 3.4, "pchip").
function endSlope(d0: number, d1: number, h0: number, h1: number): number {
	const slope = ((2 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
	if (Math.sign(slope) !== Math.sign(d0)) return 0;
	if (Math.sign(d0) !== Math.sign(d1) && Math.abs(slope) > Math.abs(3 * d0)) return 3 * d0;
	return slope;
}

export function pumpCurve(model: Pick<PumpModel, 'curve'>): PumpCurve {
	const points = model.curve.map((p) => ({ flowM3s: gph(p.flowGph), headM: feet(p.headFt) }));
	const slopes = monotoneSlopes(
		points.map((p) => p.flowM3s),
		points.map((p) => p.headM)
	);
	return { points, slopes };
}

export const maxFlow = (curve: PumpCurve) => curve.points[curve.points.length - 1].flowM3s;

/**
 * Head at a flow. Below the first point the head is held at the first point's head (a curve's
 * first point is at or near shut-off); past the last point the pump is off its published curve
 * and gives no head.
 */
export function headAt(curve: PumpCurve, flowM3s: number): number {
	const { points, slopes } = curve;
	if (flowM3s <= points[0].flowM3s) return points[0].headM;
	if (flowM3s > maxFlow(curve)) return 0;
	let i = 1;
	while (points[i].flowM3s < flowM3s) i++;
	const [p0, p1] = [points[i - 1], points[i]];
	const h = p1.flowM3s - p0.flowM3s;
	const t = (flowM3s - p0.flowM3s) / h;
	const [t2, t3] = [t * t, t * t * t];
	const head =
		(2 * t3 - 3 * t2 + 1) * p0.headM +
		(t3 - 2 * t2 + t) * h * slopes[i - 1] +
		(-2 * t3 + 3 * t2) * p1.headM +
		(t3 - t2) * h * slopes[i];
	return Math.max(0, head);
}

export interface OperatingPoint {
	flowM3s: number;
	headM: number;
	/** 'ok', 'no-flow' (cannot reach the static lift) or 'end-of-curve' (runs off its curve). */
	status: 'ok' | 'no-flow' | 'end-of-curve';
}

/**
 * Where the pump curve meets the system curve. f(Q) = pump(Q) − system(Q) falls monotonically
 * (pump head never rises, system head never falls), so bisection on a bracket always converges
 * and never leaves it: robust, and never NaN.
 */
export function operatingPoint(curve: PumpCurve, system: SystemCoefficients): OperatingPoint {
	const gap = (q: number) => headAt(curve, q) - systemHead(system, q);
	const qMax = maxFlow(curve);
	if (gap(0) <= 0) return { flowM3s: 0, headM: headAt(curve, 0), status: 'no-flow' };
	if (gap(qMax) >= 0) return { flowM3s: qMax, headM: headAt(curve, qMax), status: 'end-of-curve' };
	let [low, high] = [0, qMax];
	for (let i = 0; i < 100 && high - low > qMax * 1e-12; i++) {
		const mid = (low + high) / 2;
		if (gap(mid) > 0) low = mid;
		else high = mid;
	}
	const flow = (low + high) / 2;
	return { flowM3s: flow, headM: systemHead(system, flow), status: 'ok' };
}

export interface RunningCost {
	kwhPerMonth: number;
	centsPerMonth: number;
	centsPerSeason: number;
}

/** Energy = watts × hours; a month is the mean Gregorian month; cents by the pricing rule. */
export function runningCost(watts: number, settings: Settings): RunningCost {
	const kwhPerMonth = (watts * settings.dailyRunHours * DAYS_PER_MONTH) / 1000;
	const centsPerMonth = roundCents(kwhPerMonth * settings.electricityCentsPerKwh);
	return {
		kwhPerMonth,
		centsPerMonth,
		centsPerSeason: roundCents(
			kwhPerMonth * settings.electricityCentsPerKwh * settings.seasonMonths
		)
	};
}

export interface PumpEvaluation {
	id: string;
	name: string;
	watts: number;
	priceCents: number;
	operatingPoint: OperatingPoint;
	/** Head the pump gives at the required flow plus margin. */
	headAtMarginFlowM: number;
	suitable: boolean;
	curve: CurvePoint[];
	runningCost: RunningCost;
}

export interface PumpMatch {
	requiredFlowM3s: number;
	requiredHeadM: number;
	marginFlowM3s: number;
	/** The system's head at the flow with margin: what the pump must give there. */
	requiredHeadAtMarginM: number;
	evaluations: PumpEvaluation[];
	chosenId?: string;
	systemCurve: CurvePoint[];
	warnings: string[];
}

const PLOT_SAMPLES = 24;

function sample(maxFlowM3s: number, headFn: (q: number) => number): CurvePoint[] {
	return Array.from({ length: PLOT_SAMPLES + 1 }, (_, i) => {
		const flowM3s = (maxFlowM3s * i) / PLOT_SAMPLES;
		return { flowM3s, headM: headFn(flowM3s) };
	});
}

// A design with several water systems matches each against the same pumps: a pump's curve, its
// plotted points and running cost are worked out once per model object (the parsed catalog's own,
// new on every estimate, so nothing outlives the catalog it came from).
const preparedCache = new WeakMap<
	PumpModel,
	{ settings: Settings; curve: PumpCurve; plot: CurvePoint[]; cost: RunningCost }
>();

function prepared(model: PumpModel, settings: Settings) {
	const hit = preparedCache.get(model);
	if (hit && hit.settings === settings) return hit;
	const curve = pumpCurve(model);
	const entry = {
		settings,
		curve,
		plot: sample(maxFlow(curve), (q) => headAt(curve, q)),
		cost: runningCost(model.watts, settings)
	};
	preparedCache.set(model, entry);
	return entry;
}

function evaluate(
	model: PumpModel,
	system: SystemCoefficients,
	marginFlow: number,
	requiredHead: number,
	settings: Settings
): PumpEvaluation {
	const { curve, plot, cost } = prepared(model, settings);
	const headAtMarginFlowM = headAt(curve, marginFlow);
	return {
		id: model.id,
		name: model.name,
		watts: model.watts,
		priceCents: model.priceCents,
		operatingPoint: operatingPoint(curve, system),
		headAtMarginFlowM,
		suitable: marginFlow <= maxFlow(curve) && headAtMarginFlowM >= requiredHead,
		curve: plot,
		runningCost: cost
	};
}

const bySize = (a: PumpEvaluation, b: PumpEvaluation) =>
	a.watts - b.watts || a.priceCents - b.priceCents || a.id.localeCompare(b.id);

/**
 * The smallest suitable pump (least watts, then least price): at the total flow raised by the
 * margin from the settings, the pump's head must reach the system's head at that same flow (the
 * hardest branch's head, grown with the flow along the system curve). Comparing the pump at the
 * raised flow with the system at the design flow would count part of the margin that is not there.
 */
export function matchPump(
	models: readonly PumpModel[],
	system: SystemCoefficients,
	requiredFlowM3s: number,
	requiredHeadM: number,
	settings: Settings,
	pinnedId?: string
): PumpMatch {
	const marginFlowM3s = requiredFlowM3s * (1 + settings.pumpMarginPercent / 100);
	const requiredHeadAtMarginM = Math.max(
		requiredHeadM,
		requiredHeadM + systemHead(system, marginFlowM3s) - systemHead(system, requiredFlowM3s)
	);
	const evaluations = models
		.map((m) => evaluate(m, system, marginFlowM3s, requiredHeadAtMarginM, settings))
		.sort(bySize);
	const chosen = pinnedId
		? evaluations.find((e) => e.id === pinnedId)
		: evaluations.find((e) => e.suitable);
	const warnings: string[] = [];
	if (requiredFlowM3s > 0 && !chosen) {
		warnings.push('No pump in the price list gives the flow and head this design needs');
	}
	if (chosen && !chosen.suitable) {
		warnings.push(`${chosen.name} falls short of the flow with margin at the hardest branch`);
	}
	const plotMax = Math.max(marginFlowM3s * 1.5, ...evaluations.map((e) => e.curve.at(-1)!.flowM3s));
	return {
		requiredFlowM3s,
		requiredHeadM,
		marginFlowM3s,
		requiredHeadAtMarginM,
		evaluations,
		chosenId: chosen?.id,
		systemCurve: sample(plotMax, (q) => systemHead(system, q)),
		warnings
	};
}
