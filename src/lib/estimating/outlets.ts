/** Flow each outlet needs for the effect wanted, and the head it needs at its end. */
import { boreArea, velocityHead } from './pipes';
import { STANDARD_GRAVITY, gph, inches, feet } from './units';

export type SheetWeight = 'light' | 'medium' | 'heavy';

export type OutletInput =
	| { id: string; name: string; kind: 'bubbler'; bubbleHeightIn: number; boreIn: number }
	| { id: string; name: string; kind: 'spillway'; widthIn: number; sheet: SheetWeight }
	| { id: string; name: string; kind: 'spout'; flowGph: number; nozzleIn: number };

export interface OutletDemand {
	id: string;
	name: string;
	kind: OutletInput['kind'];
	flowM3s: number;
	/** Head needed at the outlet beyond its static lift, m of water. */
	outletHeadM: number;
	/** Whether the pipe's own velocity head is lost on discharge (a pipe end into a reservoir). */
	losesPipeVelocityHead: boolean;
	/** Spillways only: the Francis weir flow at the nominal sheet head, as a cross-check. */
	francisFlowM3s?: number;
}

// Gallons per hour per inch of spillway width, by the weight of the sheet wanted
// (common practice, no source).
export const SPILLWAY_GPH_PER_INCH: Record<SheetWeight, number> = {
	light: 50,
	medium: 100,
	heavy: 150
};

// Head of water over the lip that each sheet weight describes (common practice, no source).
export const SPILLWAY_HEAD_IN: Record<SheetWeight, number> = { light: 0.5, medium: 0.75, heavy: 1 };

// Francis weir formula for a sharp-crested weir without end contractions:
// Q = 3.33 L H^1.5, Q in ft³/s, L and H in ft (J. B. Francis, Lowell Hydraulic Experiments, 1855).
export function francisWeirFlowCfs(lengthFt: number, headFt: number): number {
	return 3.33 * lengthFt * headFt ** 1.5;
}

const CUBIC_METERS_PER_CUBIC_FOOT = feet(1) ** 3;

export function francisWeirFlowM3s(widthM: number, headM: number): number {
	return francisWeirFlowCfs(widthM / feet(1), headM / feet(1)) * CUBIC_METERS_PER_CUBIC_FOOT;
}

/**
 * A free jet rises to its velocity head, h = v²/2g (Bernoulli / Torricelli), so a bubbler that
 * lifts water h above its bore needs v = √(2gh) at the bore and Q = A·v. The dome of a real
 * bubbler spreads and stands a little lower than a free jet, so this errs toward more flow.
 */
export function bubblerFlowM3s(bubbleHeightM: number, boreDiameterM: number): number {
	return boreArea(boreDiameterM) * Math.sqrt(2 * STANDARD_GRAVITY * bubbleHeightM);
}

export function outletDemand(outlet: OutletInput): OutletDemand {
	const demand = (flowM3s: number, outletHeadM: number, losesPipeVelocityHead: boolean) => ({
		id: outlet.id,
		name: outlet.name,
		kind: outlet.kind,
		flowM3s,
		outletHeadM,
		losesPipeVelocityHead
	});
	if (outlet.kind === 'bubbler') {
		const heightM = inches(outlet.bubbleHeightIn);
		return demand(bubblerFlowM3s(heightM, inches(outlet.boreIn)), heightM, false);
	}
	if (outlet.kind === 'spout') {
		const flowM3s = gph(outlet.flowGph);
		const jetVelocity = flowM3s / boreArea(inches(outlet.nozzleIn));
		return demand(flowM3s, velocityHead(jetVelocity), false);
	}
	const headM = inches(SPILLWAY_HEAD_IN[outlet.sheet]);
	return Object.assign(
		demand(gph(SPILLWAY_GPH_PER_INCH[outlet.sheet] * outlet.widthIn), headM, true),
		{
			francisFlowM3s: francisWeirFlowM3s(inches(outlet.widthIn), headM)
		}
	);
}
