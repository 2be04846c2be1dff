/**
 * Water systems: one pump each. A fountain's is its manifold and branches; a pond's lifts the water
 * back to the pond (or up every stream that falls into it) at the turnover flow or the streams'
 * flow, whichever is more; a pondless stream's lifts its flow from the reservoir to the top pool.
 * Each system's static lift and supply friction make its system curve for the pump match.
 */
import {
	analyseHydraulics,
	exceeds,
	limitsFrom,
	pipeRun,
	sizeAdvice,
	type HydraulicsResult,
	type PipeRun,
	type SystemCoefficients
} from './hydraulics';
import { matchPump, type PumpMatch } from './pumps';
import type { Fountain, ParsedCatalog, Pond, Stream, Supply } from './schema';
import { feet, type UnitSystem } from './units';

export interface WaterSystem {
	/** The feature whose pump this is. */
	featureId: string;
	name: string;
	kind: 'fountain' | 'pond' | 'stream';
	/** The features this pump feeds (a pond and the streams that fall into it). */
	feeds: string[];
	flowM3s: number;
	requiredHeadM: number;
	staticLiftM: number;
	supply?: PipeRun;
	/** Fountains only: outlets and branches. */
	hydraulics?: HydraulicsResult;
	pump: PumpMatch;
	/** Water in the supply pipe, which drains back when the pump stops. */
	pipeDrainBackM3: number;
	warnings: string[];
}

export function fountainSystem(
	f: Fountain,
	catalog: ParsedCatalog,
	units: UnitSystem
): WaterSystem | undefined {
	if (f.outlets.length === 0) return undefined;
	const settings = catalog.settings;
	const hydraulics = analyseHydraulics(f.outlets, f.branches, f.supply, settings, units);
	const pump = matchPump(
		catalog.pumps,
		hydraulics.system,
		hydraulics.totalFlowM3s,
		hydraulics.requiredHeadM,
		settings,
		f.pumpModelId
	);
	return {
		featureId: f.id,
		name: f.name,
		kind: 'fountain',
		feeds: [f.id],
		flowM3s: hydraulics.totalFlowM3s,
		requiredHeadM: hydraulics.requiredHeadM,
		staticLiftM: hydraulics.system.staticM,
		supply: hydraulics.supply,
		hydraulics,
		pump,
		pipeDrainBackM3: hydraulics.drainBackM3,
		warnings: hydraulics.warnings
	};
}

/** A pump lifting one flow through one supply line to a static lift. */
function liftSystem(
	base: Pick<WaterSystem, 'featureId' | 'name' | 'kind' | 'feeds'>,
	flowM3s: number,
	staticLiftM: number,
	supplyInput: Supply | undefined,
	pinnedPumpId: string | undefined,
	catalog: ParsedCatalog,
	units: UnitSystem
): WaterSystem {
	const settings = catalog.settings;
	const supply = supplyInput
		? pipeRun(supplyInput.pipe, feet(supplyInput.lengthFt), flowM3s, supplyInput.fittings)
		: undefined;
	const coefficients: SystemCoefficients = {
		staticM: staticLiftM,
		frictionM: supply?.frictionLossM ?? 0,
		minorM: supply?.fittingsLossM ?? 0,
		weirM: 0,
		designFlowM3s: flowM3s
	};
	const requiredHeadM = staticLiftM + coefficients.frictionM + coefficients.minorM;
	const warnings: string[] = [];
	const limits = limitsFrom(settings);
	if (supply && exceeds(supply, limits)) {
		warnings.push(`${base.name}, supply: ${sizeAdvice(supply, limits, units, 'the flow').advice}`);
	}
	return {
		...base,
		flowM3s,
		requiredHeadM,
		staticLiftM,
		supply,
		pump: matchPump(catalog.pumps, coefficients, flowM3s, requiredHeadM, settings, pinnedPumpId),
		pipeDrainBackM3: supply?.volumeM3 ?? 0,
		warnings
	};
}

export function pondSystem(
	pond: Pond,
	turnoverFlowM3s: number,
	streams: readonly { stream: Stream; flowM3s: number }[],
	catalog: ParsedCatalog,
	units: UnitSystem
): WaterSystem {
	const streamFlow = streams.reduce((s, x) => s + x.flowM3s, 0);
	const flow = Math.max(turnoverFlowM3s, streamFlow);
	const highest = [...streams].sort((a, b) => b.stream.riseFt - a.stream.riseFt)[0];
	const base = {
		featureId: pond.id,
		name: pond.name,
		kind: 'pond' as const,
		feeds: [pond.id, ...streams.map((s) => s.stream.id)]
	};
	if (highest) {
		return liftSystem(
			base,
			flow,
			feet(highest.stream.riseFt),
			highest.stream.supply,
			pond.pumpModelId,
			catalog,
			units
		);
	}
	return liftSystem(
		base,
		flow,
		feet(pond.returnLiftFt),
		pond.supply,
		pond.pumpModelId,
		catalog,
		units
	);
}

export function streamSystem(
	stream: Stream,
	flowM3s: number,
	catalog: ParsedCatalog,
	units: UnitSystem
): WaterSystem {
	return liftSystem(
		{ featureId: stream.id, name: stream.name, kind: 'stream', feeds: [stream.id] },
		flowM3s,
		feet(stream.riseFt),
		stream.supply,
		stream.pumpModelId,
		catalog,
		units
	);
}
