/**
 * The standard starting feature (three columns over a gravel basin, toppings, a low wall, lights)
 * priced from the firm's own price list. Pure: no I/O. Each part that names a price-list item takes
 * an item of the same category that can price it (the template's SKU when the list has it, so the
 * demo keeps its numbers); a part the list cannot supply is left out or left unpriced, with a note.
 */
import { quantityInUnit, type Measure } from './pricing';
import { catalogSchema, type CatalogItem, type Design } from './schema';
import { featuresForServices } from './starter-features';
import type { Pick, Slot } from './starter-slots';
import { STANDARD_ITEM_UNITS, standardDesign } from './standard-feature';

export interface Starter {
	design: Design;
	/** What the starting design lacks because the price list cannot supply it, in plain words. */
	notes: string[];
}

const COUNT: Measure = { count: 1 };
const VOLUME: Measure = { volumeM3: 1 };
const SLOTS = {
	basin: { category: 'basin', measure: { count: 1, volumeM3: 1 } },
	fill: { category: 'aggregate', measure: VOLUME, hint: /gravel/i },
	column: { category: 'stone', measure: { count: 1, massKg: 1, volumeM3: 1 }, hint: /column/i },
	accent: { category: 'stone', measure: { count: 1, massKg: 1, volumeM3: 1 }, hint: /boulder/i },
	pebble: { category: 'aggregate', measure: { volumeM3: 1, areaM2: 1 }, hint: /pebble|river/i },
	chips: { category: 'aggregate', measure: { volumeM3: 1, areaM2: 1 }, hint: /slate|chip/i },
	wallUnit: { category: 'wall', measure: COUNT, exclude: /\bcap/i },
	wallCap: { category: 'wall', measure: COUNT, hint: /\bcap/i, strict: true },
	pad: { category: 'aggregate', measure: VOLUME, hint: /base|pad/i, strict: true },
	drain: { category: 'aggregate', measure: VOLUME, hint: /drain/i, strict: true },
	drainPipe: { category: 'wall', measure: { lengthM: 1 }, hint: /drain|perforated/i, strict: true },
	uplight: { category: 'lighting', measure: COUNT, hint: /up/i, exclude: /transformer/i },
	pathLight: { category: 'lighting', measure: COUNT, hint: /path/i, exclude: /transformer/i },
	transformer: { category: 'lighting', measure: COUNT, hint: /transformer/i, strict: true },
	cable: { category: 'electrical', measure: { lengthM: 1 }, hint: /cable|wire/i },
	coreDrill: { category: 'other', measure: { direct: 1 }, hint: /core.?drill/i, strict: true }
} satisfies Record<string, Slot>;

/**
 * The item for a part: the template's SKU when the list has it and it fits, else the best fit of
 * the category (a name that fits the part, then an item sold as the template's item is).
 */
export function pickItem(
	slot: Slot,
	templateSku: string,
	items: readonly CatalogItem[]
): CatalogItem | undefined {
	const fits = (item: CatalogItem) =>
		item.category === slot.category && quantityInUnit(slot.measure, item) !== undefined;
	const same = items.find((i) => i.sku === templateSku && fits(i));
	if (same) return same;
	const candidates = items.filter(
		(i) =>
			fits(i) && !slot.exclude?.test(i.name) && (!slot.strict || Boolean(slot.hint?.test(i.name)))
	);
	const score = (i: CatalogItem) =>
		(slot.hint?.test(i.name) ? 2 : 0) + (i.unit === STANDARD_ITEM_UNITS[templateSku] ? 1 : 0);
	// A stable pick: the best score, then the price list's own order.
	return candidates.reduce<CatalogItem | undefined>(
		(best, i) => (best && score(best) >= score(i) ? best : i),
		undefined
	);
}

function basinParts(design: Design, pick: Pick, note: (text: string) => void) {
	const fountain = design.features?.find((f) => f.kind === 'fountain');
	const basin = fountain?.kind === 'fountain' ? fountain.basin : undefined;
	if (!basin) return;
	const liner = pick(SLOTS.basin, basin.sku);
	if (liner) basin.sku = liner.sku;
	else {
		delete basin.sku;
		note('Basin: no basin item in the price list can price it, so it is not priced.');
	}
	if (basin.fill.kind === 'gravel') {
		const gravel = pick(SLOTS.fill, basin.fill.sku);
		if (gravel) basin.fill.sku = gravel.sku;
		else {
			delete basin.fill.sku;
			note('Basin gravel: no aggregate in the price list can price it by volume; not priced.');
		}
	}
}

function stoneParts(design: Design, pick: Pick, note: (text: string) => void) {
	for (const stone of design.stones ?? []) {
		const slot = stone.size.shape === 'boulder' ? SLOTS.accent : SLOTS.column;
		const item = pick(slot, stone.sku);
		if (item) stone.sku = item.sku;
		else {
			delete stone.sku;
			note(`${stone.name}: no stone item in the price list; the stone is kept but not priced.`);
		}
	}
}

/** Toppings take the firm's aggregates; an alternate left with one real choice joins the base. */
function toppingParts(design: Design, pick: Pick, note: (text: string) => void) {
	const kept: NonNullable<Design['aggregates']> = [];
	const renamed = new Map<string, string>();
	for (const topping of design.aggregates ?? []) {
		const slot = /slate/i.test(topping.name) ? SLOTS.chips : SLOTS.pebble;
		const item = pick(slot, topping.sku);
		if (!item) {
			note(`${topping.name}: no aggregate in the price list can price it; left out.`);
		} else if (kept.some((k) => k.sku === item.sku)) {
			continue; // the same item twice would make an alternate with nothing to choose
		} else {
			const substitute = item.sku !== topping.sku;
			if (substitute && topping.optionId) renamed.set(topping.optionId, item.name);
			kept.push({ ...topping, sku: item.sku, ...(substitute ? { name: item.name } : {}) });
		}
	}
	design.aggregates = kept;
	design.alternates = (design.alternates ?? []).flatMap((group) => {
		const choices = group.choices
			.map((choice) => ({ choice, topping: kept.find((k) => k.optionId === choice.id) }))
			.filter(({ topping }) => topping);
		if (choices.length < 2) {
			for (const { topping } of choices) delete topping!.optionId;
			return [];
		}
		const ids = choices.map(({ choice }) => choice.id);
		return [
			{
				...group,
				choices: choices.map(({ choice }) => ({
					...choice,
					name: renamed.get(choice.id) ?? choice.name
				})),
				selectedChoiceId: ids.includes(group.selectedChoiceId) ? group.selectedChoiceId : ids[0]
			}
		];
	});
}

function wallParts(design: Design, pick: Pick, note: (text: string) => void) {
	const kept: NonNullable<Design['walls']> = [];
	for (const wall of design.walls ?? []) {
		const unit = pick(SLOTS.wallUnit, wall.unitSku);
		if (!unit) {
			note(`${wall.name}: no wall unit in the price list; left out.`);
			continue;
		}
		wall.unitSku = unit.sku;
		const cap = pick(SLOTS.wallCap, wall.capSku);
		if (cap) wall.capSku = cap.sku;
		else {
			delete wall.capSku;
			delete wall.capLengthIn;
			note(`${wall.name}: no wall cap in the price list; the wall has no caps.`);
		}
		for (const [key, slot, what] of [
			['padSku', SLOTS.pad, 'levelling pad base'],
			['drainSku', SLOTS.drain, 'drainage stone'],
			['drainPipeSku', SLOTS.drainPipe, 'drain pipe']
		] as const) {
			const item = pick(slot, wall[key]);
			if (item) wall[key] = item.sku;
			else {
				delete wall[key];
				note(`${wall.name}: no ${what} in the price list; not priced.`);
			}
		}
		kept.push(wall);
	}
	const used = new Set(kept.map((w) => w.optionId));
	design.options = (design.options ?? []).filter(
		(o) => used.has(o.id) || !(design.walls ?? []).some((w) => w.optionId === o.id)
	);
	design.walls = kept;
}

function lightingParts(design: Design, pick: Pick, note: (text: string) => void) {
	const lighting = design.lighting;
	if (!lighting) return;
	const fixtures = lighting.fixtures.map((f) => ({
		fixture: f,
		item: pick(/path/i.test(f.name) ? SLOTS.pathLight : SLOTS.uplight, f.sku)
	}));
	if (fixtures.every(({ item }) => !item)) {
		delete design.lighting;
		note('Lighting: no light fixture in the price list; left out.');
		return;
	}
	for (const { fixture, item } of fixtures) {
		if (item) fixture.sku = item.sku;
		else delete fixture.sku;
	}
	for (const transformer of lighting.transformers) {
		const item = pick(SLOTS.transformer, transformer.sku);
		if (item) transformer.sku = item.sku;
		else {
			delete transformer.sku;
			note('Lighting: no transformer in the price list; it is not priced.');
		}
	}
	for (const run of lighting.runs) {
		const item = pick(SLOTS.cable, run.cableSku);
		if (item) run.cableSku = item.sku;
		else {
			delete run.cableSku;
			note('Lighting: no cable sold by the foot in the price list; the cable is not priced.');
		}
	}
}

function extraParts(design: Design, pick: Pick, note: (text: string) => void) {
	design.extraLines = (design.extraLines ?? []).flatMap((line) => {
		const item = pick(SLOTS.coreDrill, line.sku);
		if (item) return [{ ...line, sku: item.sku }];
		note('Core drilling through the columns: no such item in the price list; left out.');
		return [];
	});
}

/**
 * The standard starting design with the firm's items, and what it had to leave out. The features
 * follow the services the homeowner asked for (see starter-features.ts); the fountain is the
 * standard when none of them is a water feature.
 */
export function starterFromCatalog(catalog: unknown, services: readonly string[] = []): Starter {
	const parsed = catalogSchema.safeParse(catalog ?? {});
	const items = parsed.success ? parsed.data.items : [];
	const design = standardDesign();
	const notes = new Set<string>();
	const pick: Pick = (slot, templateSku) => pickItem(slot, templateSku ?? '', items);
	const note = (text: string) => notes.add(text);
	featuresForServices(design, services, items, pick, note);
	basinParts(design, pick, note);
	stoneParts(design, pick, note);
	toppingParts(design, pick, note);
	wallParts(design, pick, note);
	lightingParts(design, pick, note);
	extraParts(design, pick, note);
	if (items.length === 0) {
		return {
			design,
			notes: [
				parsed.success
					? 'The price list has no items yet, so the starting design has no priced parts. Add the firm’s items under Price list, then start a new version.'
					: 'The price list could not be read, so the starting design has no priced parts. Check the Price list page.'
			]
		};
	}
	return { design, notes: [...notes] };
}

/** The notes as one staff note for the lead's timeline (never in the homeowner's scope). */
export function starterGapsNote(notes: readonly string[]): string {
	if (notes.length === 0) return '';
	return ['Starting design: the price list could not supply', ...notes]
		.map((line, i) => (i === 0 ? line : `- ${line}`))
		.join('\n');
}
