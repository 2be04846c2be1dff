/**
 * The firm's standard feature, the template every starting design is built from (starter.ts,
 * prefill.ts, starter-features.ts) and the fountain the builder adds: three basalt columns on a
 * manifold with a valve per column, over a gravel-filled basin, with an accent boulder group, a
 * topping alternate, an optional low wall and three lights. It names price-list items by SKU; the
 * starter swaps in the firm's own items (`STANDARD_ITEM_UNITS` says how each named item is sold, so
 * a firm's item sold the same way is preferred). Sizes are starting points the salesperson
 * changes (common practice, no source). It is not demo data: the demo (scripts/seed/demo-catalog.ts) prices it.
 */
import type { Design, FeatureInput, ItemUnit } from './schema';

/** How each item the template names is sold. */
export const STANDARD_ITEM_UNITS: Readonly<Record<string, ItemUnit>> = {
	'BASIN-LINER-KIT': 'each',
	'AGG-GRAVEL-WASHED': 'ton',
	'STONE-BASALT-COL': 'ton',
	'STONE-GRANITE-ACCENT': 'each',
	'AGG-PEBBLE-RIVER': 'ton',
	'AGG-SLATE-CHIP': 'bag',
	'WALL-UNIT-16': 'each',
	'WALL-CAP-16': 'each',
	'AGG-BASE-ROAD': 'ton',
	'AGG-DRAIN-CLEAN': 'yd3',
	'PIPE-DRAIN-4': 'ft',
	'LIGHT-UPLIGHT': 'each',
	'LIGHT-PATH': 'each',
	'LIGHT-TX-150': 'each',
	'CABLE-12-2': 'ft',
	'SVC-CORE-DRILL': 'each'
};

const columnBranch = (id: string, outletId: string, lengthFt: number, staticLiftFt: number) => ({
	id,
	outletId,
	pipe: { material: 'pvc-sch40' as const, size: '3/4' as const },
	lengthFt,
	staticLiftFt,
	fittings: [
		{ kind: 'tee-branch' as const, count: 1 },
		{ kind: 'elbow-90' as const, count: 2 }
	],
	valve: 'ball-valve' as const
});

/** The standard three-column fountain: its outlets, manifold, pump choice and basin. */
export function standardFountain(): Extract<FeatureInput, { kind: 'fountain' }> {
	return {
		id: 'fountain-1',
		kind: 'fountain',
		name: 'Basalt columns',
		outlets: [
			{ id: 'col-low', name: 'Low column', kind: 'bubbler', bubbleHeightIn: 3, boreIn: 0.824 },
			{ id: 'col-mid', name: 'Middle column', kind: 'bubbler', bubbleHeightIn: 3, boreIn: 0.824 },
			{ id: 'col-tall', name: 'Tall column', kind: 'bubbler', bubbleHeightIn: 4, boreIn: 0.824 }
		],
		supply: {
			pipe: { material: 'pvc-sch40', size: '1-1/2' },
			lengthFt: 6,
			fittings: [{ kind: 'elbow-90', count: 2 }]
		},
		branches: [
			columnBranch('b-low', 'col-low', 8, 2.5),
			columnBranch('b-mid', 'col-mid', 10, 3.5),
			columnBranch('b-tall', 'col-tall', 12, 4.5)
		],
		basin: {
			size: { shape: 'rectangle', lengthFt: 6, widthFt: 4, depthFt: 2 },
			// About a third of a bed of washed round gravel is voids (from memory).
			fill: { kind: 'gravel', voidFraction: 0.35, sku: 'AGG-GRAVEL-WASHED' },
			pumpMinLevelIn: 6,
			freeboardIn: 2,
			sku: 'BASIN-LINER-KIT'
		}
	};
}

/** The standard feature: the fountain, its stones, a topping alternate, a low wall and lights. */
export function standardDesign(): Design {
	return {
		name: 'Three basalt columns over a gravel basin',
		features: [standardFountain()],
		stones: [
			{
				id: 'st-low',
				name: 'Low basalt column',
				size: { shape: 'column-hex', acrossFlatsIn: 12, heightIn: 24 },
				rock: 'basalt',
				wetted: true,
				sku: 'STONE-BASALT-COL'
			},
			{
				id: 'st-mid',
				name: 'Middle basalt column',
				size: { shape: 'column-hex', acrossFlatsIn: 12, heightIn: 36 },
				rock: 'basalt',
				wetted: true,
				sku: 'STONE-BASALT-COL'
			},
			{
				id: 'st-tall',
				name: 'Tall basalt column',
				size: { shape: 'column-hex', acrossFlatsIn: 12, heightIn: 48 },
				rock: 'basalt',
				wetted: true,
				sku: 'STONE-BASALT-COL'
			},
			{
				id: 'st-accent',
				name: 'Granite accent boulders',
				size: { shape: 'boulder', lengthIn: 14, widthIn: 10, heightIn: 8 },
				rock: 'granite',
				count: 4,
				sku: 'STONE-GRANITE-ACCENT'
			}
		],
		aggregates: [
			{
				id: 'top-pebble',
				name: 'River pebble topping',
				areas: [{ shape: 'rectangle', lengthFt: 8, widthFt: 6 }],
				depthIn: 2,
				sku: 'AGG-PEBBLE-RIVER',
				optionId: 'topping-pebble'
			},
			{
				id: 'top-slate',
				name: 'Slate chip topping',
				areas: [{ shape: 'rectangle', lengthFt: 8, widthFt: 6 }],
				depthIn: 2,
				sku: 'AGG-SLATE-CHIP',
				optionId: 'topping-slate'
			}
		],
		walls: [
			{
				id: 'seat-wall',
				name: 'Low retaining wall',
				purpose: 'retaining',
				lengthFt: 16,
				exposedHeightIn: 18,
				unit: { lengthIn: 16, heightIn: 6, depthIn: 12 },
				unitSku: 'WALL-UNIT-16',
				capSku: 'WALL-CAP-16',
				capLengthIn: 16,
				padSku: 'AGG-BASE-ROAD',
				drainSku: 'AGG-DRAIN-CLEAN',
				drainPipeSku: 'PIPE-DRAIN-4',
				optionId: 'low-wall'
			}
		],
		lighting: {
			fixtures: [
				{ id: 'fx-up-1', name: 'Column uplight', va: 5, sku: 'LIGHT-UPLIGHT' },
				{ id: 'fx-up-2', name: 'Column uplight', va: 5, sku: 'LIGHT-UPLIGHT' },
				{ id: 'fx-path', name: 'Path light', va: 4, sku: 'LIGHT-PATH' }
			],
			transformers: [
				{
					id: 'tx-1',
					name: '150 VA transformer',
					ratingVA: 150,
					tapsV: [12, 13, 14, 15],
					sku: 'LIGHT-TX-150'
				}
			],
			runs: [
				{
					id: 'run-1',
					transformerId: 'tx-1',
					tapV: 12,
					gauge: '12',
					cableSku: 'CABLE-12-2',
					fixtures: [
						{ fixtureId: 'fx-up-1', distanceFt: 30 },
						{ fixtureId: 'fx-up-2', distanceFt: 36 },
						{ fixtureId: 'fx-path', distanceFt: 55 }
					]
				}
			]
		},
		extraLines: [{ sku: 'SVC-CORE-DRILL', quantity: 3 }],
		extraLabor: [],
		options: [{ id: 'low-wall', name: 'Low retaining wall behind the feature', selected: false }],
		alternates: [
			{
				id: 'topping',
				name: 'Topping',
				choices: [
					{ id: 'topping-pebble', name: 'River pebble' },
					{ id: 'topping-slate', name: 'Slate chips' }
				],
				selectedChoiceId: 'topping-pebble'
			}
		]
	};
}
