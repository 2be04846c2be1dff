/** The basin's water budget: what it holds, the usable reserve, drain-back, daily loss. */
import type { Basin, Settings } from './schema';
import { feet, inches, toSI } from './units';

export interface BasinInputs {
	basin: Basin;
	/** Water in the pipes that runs back when the pump stops, m³. */
	pipeDrainBackM3: number;
	/** Surface of stones that water runs over, m² (a film drains back and evaporates). */
	wettedStoneAreaM2: number;
	/**
	 * Wet faces of the stones, m²: every face water runs over (the top and the sides of a column,
	 * all but the face it stands on), which evaporates about as open water does (common practice,
	 * no source).
	 */
	wettedFaceM2: number;
	/** Flow the pump circulates, m³/s. */
	flowM3s: number;
	settings: Settings;
}

export interface BasinBudget {
	surfaceAreaM2: number;
	depthM: number;
	grossVolumeM3: number;
	/** Water the basin holds brim-full, allowing for gravel. */
	waterCapacityM3: number;
	/** Water between the pump's lowest safe level and the running level. */
	usableReserveM3: number;
	/** Room between the running level and the rim for water that drains back. */
	drainBackRoomM3: number;
	drainBackM3: number;
	/** Water surface open to the air: the plan of an open basin, none under gravel. */
	openSurfaceM2: number;
	evaporationM3PerDay: number;
	splashM3PerDay: number;
	dailyLossM3: number;
	/** null when nothing is lost (the pump never runs and nothing evaporates). */
	daysBetweenTopUps: number | null;
	openWaterDepthM: number;
	warnings: string[];
}

export function basinPlan(basin: Basin): { areaM2: number; depthM: number } {
	const size = basin.size;
	const depthM = feet(size.depthFt);
	if (size.shape === 'rectangle') {
		return { areaM2: feet(size.lengthFt) * feet(size.widthFt), depthM };
	}
	if (size.shape === 'circle') {
		return { areaM2: (Math.PI / 4) * feet(size.diameterFt) ** 2, depthM };
	}
	return { areaM2: toSI(size.gallons, 'volume', 'gal') / depthM, depthM };
}

export function voidFraction(basin: Basin): number {
	return basin.fill.kind === 'gravel' ? basin.fill.voidFraction : 1;
}

function budgetWarnings(budget: Omit<BasinBudget, 'warnings'>, settings: Settings): string[] {
	const warnings: string[] = [];
	if (budget.usableReserveM3 <= 0) {
		warnings.push('The pump’s lowest safe level and the freeboard leave no usable reserve');
	}
	if (budget.drainBackM3 > budget.drainBackRoomM3) {
		warnings.push(
			'The water that drains back when the pump stops would overflow the basin: enlarge it or lower the running level'
		);
	}
	const days = budget.daysBetweenTopUps;
	if (days !== null && days < settings.minDaysBetweenTopUps) {
		warnings.push(
			`The reserve lasts ${days.toFixed(1)} days between top-ups, under the ${settings.minDaysBetweenTopUps} days wanted: enlarge the basin or add an automatic fill`
		);
	}
	return warnings;
}

export function basinBudget(inputs: BasinInputs): BasinBudget {
	const { basin, settings } = inputs;
	const { areaM2, depthM } = basinPlan(basin);
	const voids = voidFraction(basin);
	const waterPerDepth = areaM2 * voids;
	const runningDepthM = Math.max(0, depthM - inches(basin.freeboardIn));
	const usableDepthM = Math.max(0, runningDepthM - inches(basin.pumpMinLevelIn));
	const filmM3 = inputs.wettedStoneAreaM2 * (settings.wetFilmMm / 1000);
	const drainBackM3 =
		inputs.pipeDrainBackM3 + filmM3 + toSI(basin.extraDrainBackGal, 'volume', 'gal');
	// Evaporation from open water and from the wet stone faces; water under a gravel fill is shaded
	// and still, so it is left out (common practice, no source).
	const openSurfaceM2 = basin.fill.kind === 'open' ? areaM2 : 0;
	const evaporationM3PerDay =
		(openSurfaceM2 + inputs.wettedFaceM2) * inches(settings.evaporationInPerDay);
	const circulatedPerDay = inputs.flowM3s * 3600 * settings.dailyRunHours;
	const splashM3PerDay = circulatedPerDay * (settings.splashLossPercentPerDay / 100);
	const dailyLossM3 = evaporationM3PerDay + splashM3PerDay;
	const usableReserveM3 = waterPerDepth * usableDepthM;
	const budget = {
		surfaceAreaM2: areaM2,
		depthM,
		grossVolumeM3: areaM2 * depthM,
		waterCapacityM3: waterPerDepth * depthM,
		usableReserveM3,
		drainBackRoomM3: waterPerDepth * Math.min(depthM, inches(basin.freeboardIn)),
		drainBackM3,
		openSurfaceM2,
		evaporationM3PerDay,
		splashM3PerDay,
		dailyLossM3,
		daysBetweenTopUps: dailyLossM3 > 0 ? usableReserveM3 / dailyLossM3 : null,
		openWaterDepthM: basin.fill.kind === 'open' ? runningDepthM : 0
	};
	return Object.assign(budget, { warnings: budgetWarnings(budget, settings) });
}
