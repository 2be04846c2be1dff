/**
 * The estimate's starting design, read from the latest site-visit notes (visitNotesSchema in
 * $lib/schema/visits). Pure: no I/O. The firm's standard three-column feature is sized to the
 * spot, its lighting run to the distance to the house (where the power is), and the site's
 * slope, soil and access width turn into a retaining wall and extra labor the salesperson sees
 * and can change in the builder. Every trade rule here is common practice, with no source.
 */
import { SLOPES, SOILS } from '$lib/schema/visits';
import { standardDesign } from './standard-feature';
import { upgradeDesign, upgradedDesign } from './upgrade';
import {
	designSchema,
	settingsSchema,
	type Design,
	type FeatureInput,
	type Settings
} from './schema';
import { sizeReservoir } from './starter-features';
import { analyseStones, type HandlingMethod } from './stones';
import { rateTask } from './labor';
import { stoneRateKey, type Soil as SiteSoil } from './labor-rates';
import { starterFromCatalog } from './starter';

export type Notes = Record<string, unknown>;
type Slope = (typeof SLOPES)[number];
type Soil = (typeof SOILS)[number];

/** The first of the keys holding a number above zero (a form may have stored text). */
export function numberIn(notes: Notes, ...keys: string[]): number | undefined {
	for (const key of keys) {
		const v = Number(notes[key]);
		if (typeof notes[key] !== 'boolean' && Number.isFinite(v) && v > 0) return v;
	}
	return undefined;
}

export function choiceIn<T extends string>(notes: Notes, key: string, values: readonly T[]) {
	const v = notes[key];
	return typeof v === 'string' && (values as readonly string[]).includes(v) ? (v as T) : undefined;
}

const quarterHours = (h: number) => Math.round(h * 4) / 4;

// How wide the gear that carries each kind of stone to the spot is, in inches: a stone cart or
// heavy dolly about 24 in (a hoist's stone also rides one in, the hoist carried in parts), a
// walk-behind compact loader about 36 in, a skid steer about 60 in (from memory; common practice,
// no source). A person-carried or team-carried stone needs no gear.
export const GEAR_WIDTH_IN: Partial<Record<HandlingMethod, { gear: string; widthIn: number }>> = {
	cart: { gear: 'stone cart', widthIn: 24 },
	hoist: { gear: 'stone cart', widthIn: 24 },
	'compact-loader': { gear: 'compact loader', widthIn: 36 },
	'larger-machine': { gear: 'skid steer', widthIn: 60 }
};

/**
 * Stones whose gear does not fit through the access are moved in by hand on bars and rollers:
 * about as long again as setting them, so their set hours once more (common practice, no source).
 */
export function narrowAccessLabor(design: Design, accessIn: number, settings: Settings) {
	const parsed = designSchema.safeParse(upgradeDesign(design));
	if (!parsed.success) return [];
	return analyseStones(parsed.data.stones, settings).stones.flatMap((stone) => {
		const gear = GEAR_WIDTH_IN[stone.handling.method];
		if (!gear || accessIn >= gear.widthIn) return [];
		const set = rateTask(settings, stoneRateKey(stone.handling.method), {
			bucket: 'base',
			task: '',
			quantity: stone.count,
			people: stone.handling.people
		});
		const hours = quarterHours(set.hours);
		if (hours <= 0) return [];
		return [
			{
				task: `Move ${stone.name} in by hand: the ${accessIn} in access is narrower than a ${gear.gear} (${gear.widthIn} in)`,
				hours,
				...(stone.optionId ? { optionId: stone.optionId } : {})
			}
		];
	});
}

/**
 * The visit's soil as the engine's site soil (its digging rate and swell follow from it). Fill is
 * dug and hauled like loam; an unknown soil leaves the design's own.
 */
export const SITE_SOIL: Partial<Record<Soil, SiteSoil>> = {
	loam: 'loam',
	sand: 'sand',
	clay: 'clay',
	rocky: 'rocky',
	fill: 'loam'
};

/** The design's fountain with a basin, if any (the starting designs have one at most). */
const fountainOf = (design: Design) =>
	design.features?.find(
		(f): f is Extract<FeatureInput, { kind: 'fountain' }> => f.kind === 'fountain' && !!f.basin
	);

// The fall across the spot as a grade for each slope the salesperson can pick, and the share of
// the basin hours spent cutting and levelling the pad (common practice, no source). A gentle
// slope is levelled within the basin's own hours.
export const SLOPE_GRADE: Record<Slope, number> = {
	flat: 0,
	gentle: 0.05,
	moderate: 0.12,
	steep: 0.25
};
const SLOPE_LEVELLING: Partial<Record<Slope, number>> = { moderate: 0.25, steep: 0.5 };

/**
 * On a moderate or steep slope the design's retaining wall holds the uphill side: it leaves the
 * options and joins the base work, as tall as the fall across the spot (whole courses, at least
 * one), as long as the spot is wide plus a 2 ft return at each end (common practice, no source).
 */
export function applySlope(
	design: Design,
	slope: Slope,
	spot: { lengthFt?: number; widthFt?: number },
	settings: Settings
) {
	const levelling = SLOPE_LEVELLING[slope];
	if (!levelling) return;
	const wall = design.walls?.find((w) => w.purpose === 'retaining');
	if (wall) {
		const lengthFt = spot.lengthFt ?? wall.lengthFt;
		const fallIn = SLOPE_GRADE[slope] * lengthFt * 12;
		const courses = Math.max(1, Math.ceil(fallIn / wall.unit.heightIn - 1e-9));
		wall.exposedHeightIn = courses * wall.unit.heightIn;
		if (spot.widthFt) wall.lengthFt = spot.widthFt + 4;
		wall.name = 'Retaining wall on the uphill side';
		const optionId = wall.optionId;
		delete wall.optionId;
		if (optionId && !design.walls?.some((w) => w.optionId === optionId)) {
			design.options = (design.options ?? []).filter((o) => o.id !== optionId);
		}
	}
	if (fountainOf(design)) {
		const hours = quarterHours(settings.labor.rates.basin * levelling);
		if (hours > 0) {
			design.extraLabor = [
				...(design.extraLabor ?? []),
				{ task: `Cut and level the pad on a ${slope} slope`, hours }
			];
		}
	}
}

/**
 * A pond sits inside the spot with 2 ft for the edge stone and working room each side; its zones
 * go no deeper than the depth available. A stream runs the spot's length, rises with the slope
 * (at least a foot), and its three falls share the rise (common practice, no source).
 */
function sizeWaterToSpot(design: Design, notes: Notes, settings: Settings) {
	const length = numberIn(notes, 'spotLengthFt');
	const width = numberIn(notes, 'spotWidthFt');
	const depthIn = numberIn(notes, 'depthAvailableIn');
	const slope = choiceIn(notes, 'slope', SLOPES);
	for (const f of design.features ?? []) {
		if (f.kind === 'pond' && f.outline.shape !== 'polygon') {
			if (length) f.outline.lengthFt = Math.max(4, Math.min(length - 4, 60));
			if (width) f.outline.widthFt = Math.max(3, Math.min(width - 4, 40));
			if (depthIn) f.zones = f.zones.map((z) => ({ ...z, depthIn: Math.min(z.depthIn, depthIn) }));
		}
		if (f.kind === 'stream' && length) {
			const each = Math.max(3, Math.round((Math.min(length, 150) / f.segments.length) * 2) / 2);
			f.segments = f.segments.map((s) => ({ ...s, lengthFt: each }));
			const rise = Math.max(1, Math.round(SLOPE_GRADE[slope ?? 'gentle'] * length * 2) / 2);
			f.riseFt = rise;
			const fallIn = Math.floor((rise * 12) / f.segments.length);
			f.segments = f.segments.map((s) => ({ ...s, fallHeightIn: fallIn }));
			f.supply.lengthFt = Math.ceil(each * f.segments.length + 5);
			sizeReservoir(f, settings);
		}
	}
}

function sizeToSpot(design: Design, notes: Notes) {
	const length = numberIn(notes, 'spotLengthFt');
	const width = numberIn(notes, 'spotWidthFt');
	const depthIn = numberIn(notes, 'depthAvailableIn');
	const size = fountainOf(design)?.basin?.size;
	if (size && size.shape === 'rectangle') {
		// The basin sits inside the spot with a foot of stone edge each side (common practice, no source).
		if (length) size.lengthFt = Math.max(2, Math.min(length - 2, 20));
		if (width) size.widthFt = Math.max(2, Math.min(width - 2, 20));
		if (depthIn) size.depthFt = Math.max(1, Math.min(size.depthFt, depthIn / 12));
	}
	const power = numberIn(notes, 'toHouseFt');
	const run = design.lighting?.runs[0];
	if (run && power) {
		const base = run.fixtures[0].distanceFt;
		run.fixtures = run.fixtures.map((f) => ({ ...f, distanceFt: f.distanceFt - base + power }));
	}
}

/**
 * A starting design named for the lead, from the latest visit notes where present; a full design
 * stored in notes.design wins. `engine` is the firm's engine settings (task hours, lifting
 * limits); without them the engine's defaults apply. `catalog` is the firm's price list: the
 * standard feature takes its items (see starter.ts). Without one, the standard feature with the
 * items the template names when no services are given, else the services' features unpriced.
 */
export function starterDesign(
	label: string,
	notes: Notes | null,
	engine?: unknown,
	catalog?: unknown,
	services: readonly string[] = []
): Design {
	if (notes && typeof notes.design === 'object' && notes.design) {
		return upgradedDesign(notes.design);
	}
	const design =
		catalog === undefined && services.length === 0
			? standardDesign()
			: starterFromCatalog(catalog ?? { items: [] }, services).design;
	design.name = label;
	const parsedSettings = settingsSchema.safeParse(engine ?? {});
	const settings = parsedSettings.success ? parsedSettings.data : settingsSchema.parse({});
	if (!notes) return design;
	sizeToSpot(design, notes);
	sizeWaterToSpot(design, notes, settings);
	const slope = choiceIn(notes, 'slope', SLOPES);
	if (slope) {
		const spot = {
			lengthFt: numberIn(notes, 'spotLengthFt'),
			widthFt: numberIn(notes, 'spotWidthFt')
		};
		applySlope(design, slope, spot, settings);
	}
	const soil = choiceIn(notes, 'soil', SOILS);
	const access = numberIn(notes, 'accessWidthIn');
	const siteSoil = soil ? SITE_SOIL[soil] : undefined;
	if (siteSoil) design.site = { ...(design.site ?? {}), soil: siteSoil };
	design.extraLabor = [
		...(design.extraLabor ?? []),
		...(access ? narrowAccessLabor(design, access, settings) : [])
	];
	return design;
}

/** The site in plain words for the scope: only what the notes say. */
function siteLine(notes: Notes) {
	const slope = choiceIn(notes, 'slope', SLOPES);
	const soil = choiceIn(notes, 'soil', SOILS);
	const access = numberIn(notes, 'accessWidthIn');
	const parts = [
		slope ? `${slope} slope` : '',
		soil && soil !== 'unknown' ? `${soil} soil` : '',
		access ? `access ${access} in wide` : ''
	].filter(Boolean);
	return parts.length ? `Site: ${parts.join(', ')}` : '';
}

/** The scope's first words: the visit's notes, where the power is and the site; else the lead's message. */
export function scopeFromNotes(notes: Notes | null, leadMessage: string): string {
	const text = [
		notes?.notes,
		notes?.powerLocation ? `Power: ${notes.powerLocation}` : '',
		notes ? siteLine(notes) : ''
	]
		.filter((t): t is string => typeof t === 'string' && t.trim() !== '')
		.join('\n');
	return (text || leadMessage).slice(0, 2000);
}
