// Whole estimates with the yard features: a path and planting with no water at all, a dry creek
// with its boulders, and lighting alone.
import { describe, expect, it } from 'vitest';
import { demoCatalog, demoDesign } from '../../../scripts/seed/demo-catalog';
import { estimate, type EstimateSuccess } from './index';
import { catalogSchema, type Design } from './schema';
import { starterDrainage, starterPath, starterPlanting } from './starter-yard';

const catalog = demoCatalog();
const items = catalogSchema.parse(catalog).items;

function ok(design: Design): EstimateSuccess {
	const r = estimate(design, catalog);
	if (!r.ok) throw new Error(JSON.stringify(r.errors));
	return r;
}

const bare = (over: Partial<Design>): Design => ({ name: 'Yard', ...over });

describe('a path and planting estimate', () => {
	const r = ok(bare({ features: [starterPath(items), starterPlanting(items)] }));

	it('prices the stone by the ton, the layers, edge, steps, plants, mulch and compost', () => {
		const line = (sku: string) => r.pricing.lines.find((l) => l.sku === sku);
		// 0.77 tons of sandstone rounds up to the tenth: 0.8.
		expect(line('FLAG-SANDSTONE')?.quantity).toBe(0.8);
		expect(line('AGG-BASE-ROAD')?.unit).toBe('ton');
		expect(line('AGG-BEDDING-SAND')).toBeDefined();
		expect(line('EDGE-RESTRAINT')?.quantity).toBe(48);
		expect(line('STEP-STONE-4')?.quantity).toBe(2);
		expect(line('PLANT-PERENNIAL-1G')?.quantity).toBe(30);
		expect(line('PLANT-GRASS-1G')?.quantity).toBe(12);
		expect(line('PLANT-SHRUB-5G')?.quantity).toBe(3);
		expect(line('MULCH-BARK')?.quantity).toBe(1);
		expect(line('COMPOST-BLEND')?.quantity).toBeCloseTo(0.7, 9);
		// Every material line belongs to its feature, so the homeowner's page lists it under the name;
		// the dug soil hauled away and the delivery are the site's.
		const own = r.pricing.lines.filter((l) => !['SPOIL-HAUL-YD3', 'DELIVERY-LOAD'].includes(l.sku));
		expect(own.every((l) => l.feature === 'path-1' || l.feature === 'planting-1')).toBe(true);
		expect(line('SPOIL-HAUL-YD3')).toBeDefined();
	});

	it('has labor for every part, and no pump or water system', () => {
		expect(r.systems).toEqual([]);
		const tasks = r.labor.tasks.map((t) => t.task);
		expect(tasks).toContain('Dig Flagstone path (by hand)');
		expect(tasks).toContain('Lay flagstone: Flagstone path');
		expect(tasks).toContain('Build steps: Flagstone path');
		expect(tasks).toContain('Plant Perennials: Planting beds');
		expect(tasks).toContain('Spread mulch: Planting beds');
		for (const t of r.labor.tasks) expect(t.people * t.hoursEach).toBeCloseTo(t.hours, 9);
		expect(r.pricing.totalCents).toBeGreaterThan(0);
	});

	it('shows the digging, foundation and step cautions, and no electrical or open-water ones', () => {
		const ids = r.cautions.map((c) => c.id);
		expect(ids).toEqual(
			expect.arrayContaining(['locate-utilities', 'foundation-drainage', 'steps', 'local-codes'])
		);
		expect(ids).not.toContain('ground-fault-protection');
		expect(ids).not.toContain('open-water');
	});
});

describe('a dry creek', () => {
	const r = ok(bare({ features: [starterDrainage(items)] }));

	it('prices cobble by weight, fabric by area, boulders as stones, soak-away gravel', () => {
		const skus = r.pricing.lines.map((l) => l.sku);
		expect(skus).toEqual(
			expect.arrayContaining([
				'AGG-COBBLE-RIVER',
				'FABRIC-WOVEN',
				'STONE-CREEK-BOULDER',
				'AGG-DRAIN-CLEAN'
			])
		);
		expect(r.stones.stones.find((s) => s.id === 'drainage-1-boulders')?.count).toBe(10);
		expect(r.quantities.some((q) => q.id === 'runoff-drainage-1')).toBe(true);
		const caution = r.cautions.find((c) => c.id === 'foundation-drainage');
		expect(caution?.reference).toMatch(/R401\.3/);
		expect(caution?.reason).toMatch(/Dry creek/);
	});

	it('refuses a price-list reference that is not in the list, at its field', () => {
		const design = bare({ features: [{ ...starterDrainage(items), cobbleSku: 'NOPE' }] });
		const bad = estimate(design, catalog);
		expect(bad.ok).toBe(false);
		if (!bad.ok) expect(bad.errors[0].path).toBe('design.features.0.cobbleSku');
	});
});

describe('a lighting-only design', () => {
	it('prices the lights, transformer and cable with no water feature', () => {
		const r = ok(bare({ lighting: demoDesign().lighting }));
		expect(r.systems).toEqual([]);
		expect(r.features).toEqual([]);
		const skus = r.pricing.lines.map((l) => l.sku).sort();
		expect(skus).toEqual(['CABLE-12-2', 'LIGHT-PATH', 'LIGHT-TX-150', 'LIGHT-UPLIGHT']);
		expect(r.labor.tasks.map((t) => t.task)).toEqual(
			expect.arrayContaining(['Set and wire lighting fixtures', 'Trench and lay lighting cable'])
		);
		expect(r.cautions.map((c) => c.id)).toEqual(
			expect.arrayContaining([
				'locate-utilities',
				'ground-fault-protection',
				'licensed-electrician'
			])
		);
		expect(r.cautions.map((c) => c.id)).not.toContain('open-water');
		expect(r.pricing.totalCents).toBeGreaterThan(0);
	});
});

describe('starting designs for dry-yard services', () => {
	it('a patio and planting lead starts from a path and beds, with no water, stones or lights', async () => {
		const { starterFromCatalog } = await import('./starter');
		const { design, notes } = starterFromCatalog(catalog, ['patio', 'planting']);
		expect(design.features?.map((f) => f.kind)).toEqual(['path', 'planting']);
		expect(design.lighting).toBeUndefined();
		expect(design.stones).toEqual([]);
		expect(design.name).toBe('Path and planting');
		expect(notes).toEqual([]);
		const { starterLabel } = await import('./starter-features');
		expect(starterLabel('Ada', ['patio', 'planting'])).toBe('Ada — path and planting');
		expect(starterLabel('Ada', ['lighting'])).toBe('Ada — lighting');
		expect(starterLabel('Ada', ['pond', 'planting'])).toBe('Ada — water feature');
		expect(ok(design).systems).toEqual([]);
	});

	it('a lighting lead starts from lighting alone', async () => {
		const { starterFromCatalog } = await import('./starter');
		const { design } = starterFromCatalog(catalog, ['lighting']);
		expect(design.features).toEqual([]);
		expect(design.lighting?.fixtures.length).toBeGreaterThan(0);
		expect(design.walls).toEqual([]);
		const r = ok(design);
		expect(r.pricing.lines.every((l) => /^(LIGHT|CABLE)-/.test(l.sku))).toBe(true);
	});
});
