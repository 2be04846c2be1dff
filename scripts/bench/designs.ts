/**
 * The designs the estimate benchmark (`npm run bench:estimate`, estimate.ts beside this file) times:
 * the three-outlet demo, a twelve-outlet design with lighting and a wall, and a whole yard: a pond,
 * a three-fall pondless stream, the three-column fountain, lights and a wall.
 */
import { demoCatalog, demoDesign, demoFountain } from '../seed/demo-catalog';
import type { Design } from '../../src/lib/estimating/schema';
import { starterPond, starterStream } from '../../src/lib/estimating/starter-features';

export function yardDesign(): Design {
	const base = demoDesign();
	const items = demoCatalog().items ?? [];
	const stream = starterStream(items as never);
	return {
		...base,
		name: 'Pond, stream and fountain',
		features: [
			{
				...starterPond(),
				linerSku: 'LINER-EPDM-10X15',
				underlaymentSku: 'UNDERLAY-FT2',
				gravelSku: 'AGG-PEBBLE-RIVER',
				edgeStoneSku: 'STONE-EDGE-FLAG'
			},
			{
				...stream,
				linerSku: 'LINER-EPDM-10X15',
				underlaymentSku: 'UNDERLAY-FT2',
				gravelSku: 'AGG-STREAM-GRAVEL',
				boulderSku: 'STONE-BANK-BOULDER',
				weirBoxSku: 'WEIR-BOX-18',
				reservoir: { ...stream.reservoir!, sku: 'RESERVOIR-VAULT', fillSku: 'AGG-GRAVEL-WASHED' }
			},
			demoFountain()
		],
		walls: base.walls!.map((w) => ({ ...w, optionId: undefined })),
		options: []
	};
}

export function twelveOutletDesign(): Design {
	const base = demoDesign();
	const outlets = Array.from({ length: 12 }, (_, i) => ({
		id: `col-${i}`,
		name: `Column ${i + 1}`,
		kind: 'bubbler' as const,
		bubbleHeightIn: 2 + (i % 3),
		boreIn: 0.824
	}));
	const branches = outlets.map((o, i) => ({
		id: `b-${i}`,
		outletId: o.id,
		pipe: { material: 'pvc-sch40' as const, size: i % 4 === 0 ? ('1' as const) : ('3/4' as const) },
		lengthFt: 8 + i,
		staticLiftFt: 2 + (i % 4),
		fittings: [
			{ kind: 'tee-branch' as const, count: 1 },
			{ kind: 'elbow-90' as const, count: 2 }
		],
		valve: 'ball-valve' as const
	}));
	const fixtures = Array.from({ length: 10 }, (_, i) => ({
		id: `fx-${i}`,
		name: `Light ${i + 1}`,
		va: 4 + (i % 3)
	}));
	return {
		...base,
		features: [
			{
				...demoFountain(),
				outlets,
				branches,
				supply: {
					pipe: { material: 'pvc-sch40', size: '2' },
					lengthFt: 10,
					fittings: [{ kind: 'elbow-90', count: 2 }]
				}
			}
		],
		stones: outlets.map((o, i) => ({
			id: `st-${i}`,
			name: `Column stone ${i + 1}`,
			size: { shape: 'column-hex' as const, acrossFlatsIn: 10, heightIn: 24 + 6 * (i % 4) },
			rock: 'basalt' as const,
			wetted: true,
			sku: 'STONE-BASALT-COL'
		})),
		lighting: {
			fixtures,
			transformers: [
				{ id: 'tx-1', name: '300 VA transformer', ratingVA: 300, tapsV: [12, 13, 14, 15] }
			],
			runs: [0, 1].map((r) => ({
				id: `run-${r}`,
				transformerId: 'tx-1',
				tapV: 13,
				gauge: '12' as const,
				fixtures: fixtures
					.slice(r * 5, r * 5 + 5)
					.map((f, i) => ({ fixtureId: f.id, distanceFt: 20 + 12 * i }))
			}))
		},
		walls: base.walls!.map((w) => ({ ...w, optionId: undefined, lengthFt: 30 })),
		options: []
	};
}
