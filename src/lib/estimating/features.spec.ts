import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import fixture from '../../../tests/fixtures/accepted-v1.json';
import { yardDesign } from '../../../scripts/bench/designs';
import { demoCatalog, demoDesign, demoFountain } from '../../../scripts/seed/demo-catalog';
import { estimate, type EstimateSuccess } from './index';
import { defaultChoices, priceWithOverrides, totalsForChoices } from './overrides';
import type { Design, FeatureInput } from './schema';
import { starterDesign } from './prefill';
import { upgradeDesign } from './upgrade';

const catalog = demoCatalog();

function ok(design: unknown): EstimateSuccess {
	const result = estimate(design, catalog);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}

// Money and figures that may rightly be negative: an alternate's difference from the chosen one,
// the margin, and plan coordinates; everything else the engine returns is a size, a count or cents.
const SIGNED = new Set(['deltaCents', 'marginCents']);

function badNumbers(value: unknown, path = 'result'): string[] {
	if (typeof value === 'number') {
		const key = path.split('.').pop()!;
		return !Number.isFinite(value) || (value < 0 && !SIGNED.has(key)) ? [path] : [];
	}
	if (value === null || typeof value !== 'object') return [];
	return Object.entries(value).flatMap(([k, v]) => badNumbers(v, `${path}.${k}`));
}

const pond = fc
	.record({
		lengthFt: fc.double({ min: 3, max: 40, noNaN: true }),
		widthFt: fc.double({ min: 3, max: 30, noNaN: true }),
		oval: fc.boolean(),
		depths: fc.array(fc.integer({ min: 4, max: 48 }), { minLength: 1, maxLength: 4 }),
		fish: fc.boolean()
	})
	.map((p, i = 0): FeatureInput => ({
		id: `pond-${i}`,
		kind: 'pond',
		name: 'Pond',
		outline: { shape: p.oval ? 'oval' : 'rectangle', lengthFt: p.lengthFt, widthFt: p.widthFt },
		zones: p.depths.map((depthIn, k) => ({
			depthIn,
			percent: k === 0 ? 100 - 10 * (p.depths.length - 1) : 10
		})),
		use: p.fish ? 'fish' : 'plants',
		linerSku: 'LINER-EPDM-10X15',
		underlaymentSku: 'UNDERLAY-FT2',
		gravelSku: 'AGG-PEBBLE-RIVER',
		edgeStoneSku: 'STONE-EDGE-FLAG'
	}));

const segment = fc.record({
	lengthFt: fc.double({ min: 2, max: 30, noNaN: true }),
	widthFt: fc.double({ min: 1, max: 6, noNaN: true }),
	fallHeightIn: fc.integer({ min: 0, max: 18 }),
	weirWidthIn: fc.integer({ min: 6, max: 36 })
});

const stream = fc
	.record({
		segments: fc.array(segment, { minLength: 1, maxLength: 5 }),
		extraRiseFt: fc.double({ min: 0.5, max: 6, noNaN: true }),
		weir: fc.boolean(),
		gravelReservoir: fc.boolean()
	})
	.map((s): FeatureInput => ({
		id: 'stream-1',
		kind: 'stream',
		name: 'Stream',
		riseFt: s.segments.reduce((sum, x) => sum + x.fallHeightIn / 12, 0) + s.extraRiseFt,
		segments: s.segments.map((x, k) => ({ id: `seg-${k}`, waterDepthIn: 2, ...x })),
		flow: s.weir ? { method: 'weir', sheet: 'medium' } : { method: 'per-inch' },
		supply: { pipe: { material: 'flex-pvc', size: '2' }, lengthFt: 40 },
		reservoir: {
			kind: s.gravelReservoir ? 'gravel' : 'open',
			lengthFt: 6,
			widthFt: 4,
			depthFt: 3,
			sku: 'RESERVOIR-VAULT'
		},
		linerSku: 'LINER-EPDM-10X15',
		gravelSku: 'AGG-STREAM-GRAVEL',
		boulderSku: 'STONE-BANK-BOULDER',
		boulder: { lengthIn: 14, widthIn: 12, heightIn: 10, rock: 'granite', spacingFt: 3 }
	}));

const design = fc
	.record({
		pond: fc.option(pond, { nil: undefined }),
		stream: fc.option(stream, { nil: undefined }),
		fountain: fc.boolean(),
		streamIntoPond: fc.boolean()
	})
	.map(({ pond: p, stream: s, fountain, streamIntoPond }): Design => {
		const features: FeatureInput[] = [];
		if (p) features.push(p);
		if (s && s.kind === 'stream') {
			features.push(p && streamIntoPond ? { ...s, feedsPondId: p.id, reservoir: undefined } : s);
		}
		if (fountain || features.length === 0) features.push(demoFountain());
		return { ...demoDesign(), features };
	});

describe('any valid multi-feature design (fast-check)', () => {
	it('gives finite, non-negative numbers everywhere', () => {
		fc.assert(
			fc.property(design, (d) => {
				expect(badNumbers(ok(d))).toEqual([]);
			}),
			{ numRuns: 150 }
		);
	});

	it('never costs less when a feature is added', () => {
		fc.assert(
			fc.property(design, pond, (d, extra) => {
				const before = ok(d).pricing.totalCents;
				const more = { ...d, features: [...(d.features ?? []), { ...extra, id: 'added-pond' }] };
				expect(ok(more).pricing.totalCents).toBeGreaterThanOrEqual(before);
			}),
			{ numRuns: 100 }
		);
	});

	it('never needs a smaller reservoir for a longer stream', () => {
		fc.assert(
			fc.property(stream, fc.double({ min: 0.1, max: 40, noNaN: true }), (s, longer) => {
				if (s.kind !== 'stream') return;
				const long = {
					...s,
					segments: s.segments.map((x, k) =>
						k === 0 ? { ...x, lengthFt: x.lengthFt + longer } : x
					)
				};
				const need = (f: FeatureInput) =>
					ok({ name: 'x', features: [f] }).features[0].stream!.requiredReserveM3;
				expect(need(long)).toBeGreaterThanOrEqual(need(s));
			}),
			{ numRuns: 100 }
		);
	});

	it('never needs less liner for a deeper pond', () => {
		fc.assert(
			fc.property(pond, fc.integer({ min: 1, max: 24 }), (p, deeper) => {
				if (p.kind !== 'pond') return;
				const deep = { ...p, zones: p.zones.map((z) => ({ ...z, depthIn: z.depthIn + deeper })) };
				const liner = (f: FeatureInput) => {
					const r = ok({ name: 'x', features: [f] }).features[0].pond!.liner;
					return r.lengthFt * r.widthFt;
				};
				expect(liner(deep)).toBeGreaterThan(liner(p));
			}),
			{ numRuns: 100 }
		);
	});
});

describe('whole features as options', () => {
	it('a stream with an optional fountain: leaving the option out takes exactly its part off', () => {
		const base = yardDesign();
		const d: Design = {
			...base,
			features: [base.features![1], { ...demoFountain(), optionId: 'fountain' }],
			options: [{ id: 'fountain', name: 'Basalt column fountain', selected: true }]
		};
		const r = ok(d);
		const option = r.pricing.options.find((o) => o.id === 'fountain')!;
		const fountainLines = r.pricing.lines.filter((l) => l.bucket === 'fountain');
		// The pump, the pipes, the basin and its fill all move with the fountain.
		expect(fountainLines.map((l) => l.sku)).toEqual(
			expect.arrayContaining(['BASIN-LINER-KIT', 'PIPE-S40-075', 'AGG-GRAVEL-WASHED'])
		);
		expect(fountainLines.some((l) => l.sku.startsWith('pump:'))).toBe(true);
		const priced = priceWithOverrides(r, d, catalog, []);
		const chosen = defaultChoices(priced.pricing);
		const withIt = totalsForChoices(priced.pricing, chosen, priced.depositPercent).totalCents;
		const without = totalsForChoices(
			priced.pricing,
			{ ...chosen, options: chosen.options.filter((o) => o !== 'fountain') },
			priced.depositPercent
		).totalCents;
		expect(withIt - without).toBe(option.totals.totalCents);
		expect(option.totals.totalCents).toBeGreaterThan(0);
	});
});

describe('designs stored before features existed', () => {
	// The accepted estimate keeps the totals stored with it; only a recomputation changes, and
	// then only where the engine now counts differently: labor in crew-hours, and the wall pad
	// bought loose. Every other line is priced as it was accepted.
	it('read as one fountain; a recomputation keeps every material line but the wall pad', () => {
		const upgraded = upgradeDesign(fixture.design) as Design;
		expect(upgraded.features).toHaveLength(1);
		expect(upgradeDesign(upgraded)).toEqual(upgraded); // idempotent
		const result = estimate(fixture.design, fixture.catalog);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const priced = priceWithOverrides(result, fixture.design, fixture.catalog, []);
		const isPad = (l: { sku: string }) => l.sku === 'AGG-BASE-ROAD';
		const lines = priced.lines.map(({ feature: _f, ...line }) => (void _f, line));
		expect(lines.filter((l) => !isPad(l))).toEqual(
			fixture.priced.lines.filter((l: { sku: string }) => !isPad(l))
		);
		expect(priced.pricing.base.materialsCents).toBe(fixture.priced.base.materialsCents);
		// People × hours: the crew-hours of the accepted base work grow (the columns now count the
		// four people who set each one).
		expect(priced.pricing.base.laborHours).toBeGreaterThan(fixture.priced.base.laborHours);
	});
});

describe('the starting design follows the inquiry', () => {
	const kinds = (services: string[]) =>
		(starterDesign('x', null, undefined, catalog, services).features ?? []).map((f) => f.kind);
	it('pond → pond, stream → stream, fountain → fountain, several → several', () => {
		expect(kinds(['pond'])).toEqual(['pond']);
		expect(kinds(['stream'])).toEqual(['stream']);
		expect(kinds(['water-feature'])).toEqual(['fountain']);
		// Lighting alone is a lighting-only design; paths and planting are features of their own.
		expect(kinds(['lighting'])).toEqual([]);
		expect(kinds(['patio', 'planting'])).toEqual(['path', 'planting']);
		expect(kinds(['other'])).toEqual(['fountain']);
		expect(kinds(['pond', 'stream', 'water-feature'])).toEqual(['pond', 'stream', 'fountain']);
	});

	it('sizes a pond and a stream from the visit notes, and the stream’s reservoir to hold it', () => {
		const notes = { spotLengthFt: 24, spotWidthFt: 14, depthAvailableIn: 24, slope: 'moderate' };
		const d = starterDesign('x', notes, undefined, catalog, ['pond']);
		const p = d.features![0];
		expect(p.kind === 'pond' && p.outline).toMatchObject({ lengthFt: 20, widthFt: 10 });
		expect(p.kind === 'pond' && Math.max(...p.zones.map((z) => z.depthIn))).toBe(24);
		const s = starterDesign('x', notes, undefined, catalog, ['stream']).features![0];
		// A moderate slope is a 12% grade (common practice, no source): 24 ft rises 2.88 → 3 ft.
		expect(s.kind === 'stream' && s.riseFt).toBe(3);
		const r = ok({ name: 'x', features: [s] }).features[0].stream!;
		expect(r.reservoir!.roomM3).toBeGreaterThanOrEqual(r.requiredReserveM3);
	});
});
