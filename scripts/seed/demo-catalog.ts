/**
 * Invented demo data for the firm "Copperleaf Water & Stone", for the seed, the benches and the
 * tests only (nothing that ships imports it): the demo design is the firm's standard feature
 * (standard-feature.ts), priced from the demo price list below. Prices and pump curves are made up.
 */
import type { Catalog, CatalogItem, ItemUnit } from '../../src/lib/estimating/schema';
import { standardDesign, standardFountain } from '../../src/lib/estimating/standard-feature';

/** The demo's three-column fountain: the standard one. */
export const demoFountain = standardFountain;
/** The demo design: the standard feature. */
export const demoDesign = standardDesign;

const item = (
	sku: string,
	name: string,
	category: CatalogItem['category'],
	unit: ItemUnit,
	unitCost: number,
	unitPrice: number,
	extra: object = {}
) => ({ sku, name, category, unit, unitCost, unitPrice, ...extra });

export function demoCatalog(): Catalog {
	return {
		items: [
			item('PIPE-S40-075', '3/4 in Schedule 40 PVC pipe', 'pipe', 'ft', 45, 95, {
				pipe: { material: 'pvc-sch40', size: '3/4' }
			}),
			item('PIPE-S40-100', '1 in Schedule 40 PVC pipe', 'pipe', 'ft', 65, 135, {
				pipe: { material: 'pvc-sch40', size: '1' }
			}),
			item('PIPE-S40-150', '1-1/2 in Schedule 40 PVC pipe', 'pipe', 'ft', 110, 225, {
				pipe: { material: 'pvc-sch40', size: '1-1/2' }
			}),
			item('FIT-ELL-075', '3/4 in 90° elbow', 'fitting', 'each', 60, 150, {
				fitting: { kind: 'elbow-90', size: '3/4' }
			}),
			item('FIT-ELL-150', '1-1/2 in 90° elbow', 'fitting', 'each', 180, 400, {
				fitting: { kind: 'elbow-90', size: '1-1/2' }
			}),
			item('FIT-TEE-075', 'Manifold port, 3/4 in', 'fitting', 'each', 250, 600, {
				fitting: { kind: 'tee-branch', size: '3/4' }
			}),
			item('VALVE-BALL-075', '3/4 in ball valve', 'valve', 'each', 650, 1500, {
				fitting: { kind: 'ball-valve', size: '3/4' }
			}),
			item(
				'BASIN-LINER-KIT',
				'Basin liner and underlayment kit, 6 × 4 × 2 ft',
				'basin',
				'each',
				18000,
				34000
			),
			item(
				'AGG-GRAVEL-WASHED',
				'Washed round gravel, 3/4–1-1/2 in',
				'aggregate',
				'ton',
				4200,
				8500,
				{ bulkDensityLbFt3: 100 }
			),
			item('AGG-PEBBLE-RIVER', 'River pebble, 1–2 in', 'aggregate', 'ton', 9000, 17500, {
				bulkDensityLbFt3: 95
			}),
			item('AGG-SLATE-CHIP', 'Slate chips, 0.5 ft³ bag', 'aggregate', 'bag', 700, 1450, {
				bagVolumeFt3: 0.5
			}),
			item('AGG-BASE-ROAD', 'Compactable road base', 'aggregate', 'ton', 2800, 6000, {
				bulkDensityLbFt3: 110
			}),
			item('AGG-DRAIN-CLEAN', 'Clean crushed drainage stone', 'aggregate', 'yd3', 5200, 9800),
			item('STONE-BASALT-COL', 'Basalt column, drilled', 'stone', 'ton', 60000, 110000),
			item('STONE-GRANITE-ACCENT', 'Granite accent boulder', 'stone', 'each', 3500, 7500),
			item('WALL-UNIT-16', 'Segmental wall unit 16 × 6 × 12 in', 'wall', 'each', 450, 950),
			item('WALL-CAP-16', 'Wall cap 16 in', 'wall', 'each', 600, 1300),
			item('LIGHT-UPLIGHT', 'LED uplight, brass', 'lighting', 'each', 5500, 12500),
			item('LIGHT-PATH', 'LED path light', 'lighting', 'each', 6000, 13500),
			item(
				'LIGHT-TX-150',
				'Low-voltage transformer 150 VA, multi-tap',
				'lighting',
				'each',
				16000,
				32000
			),
			item('CABLE-12-2', 'Direct-burial cable 12/2', 'electrical', 'ft', 55, 120),
			item('SVC-CORE-DRILL', 'Core drilling through a column', 'other', 'each', 4000, 9000),
			// Paths and patios, dry creeks and planting (invented prices).
			item('FLAG-SANDSTONE', 'Sandstone flagstone, 1–2 in', 'paving', 'ton', 29000, 56000),
			item('PAVER-CONCRETE-84', 'Concrete paver 8 × 4 in', 'paving', 'ft2', 420, 950),
			item('STEP-STONE-4', 'Stone step slab, 4 ft × 14 in × 6 in', 'paving', 'each', 16000, 32000),
			item('EDGE-RESTRAINT', 'Paver edge restraint, 8 ft lengths', 'paving', 'ft', 95, 220, {
				increment: 8
			}),
			item('AGG-BEDDING-SAND', 'Concrete sand for bedding', 'aggregate', 'ton', 3200, 6800, {
				bulkDensityLbFt3: 100
			}),
			item('AGG-JOINT-POLY', 'Polymeric joint sand, 0.5 ft³ bag', 'aggregate', 'bag', 2400, 4200, {
				bagVolumeFt3: 0.5
			}),
			item('AGG-COBBLE-RIVER', 'River cobble, 3–6 in', 'aggregate', 'ton', 9500, 18500, {
				bulkDensityLbFt3: 95
			}),
			item('FABRIC-WOVEN', 'Woven landscape fabric', 'other', 'ft2', 12, 35),
			item('STONE-CREEK-BOULDER', 'Creek bank boulder', 'stone', 'each', 4500, 9500),
			item('PLANT-PERENNIAL-1G', 'Perennial, 1 gal', 'planting', 'each', 650, 1600),
			item('PLANT-GRASS-1G', 'Ornamental grass, 1 gal', 'planting', 'each', 700, 1700),
			item('PLANT-SHRUB-5G', 'Flowering shrub, 5 gal', 'planting', 'each', 2200, 5200),
			item('MULCH-BARK', 'Shredded bark mulch', 'planting', 'yd3', 3200, 6500),
			item('COMPOST-BLEND', 'Compost soil amendment', 'planting', 'yd3', 3800, 7800),
			// Ponds and streams. A liner sheet names its size and family: the engine takes the
			// smallest sheet of the family that covers the bed, or seams sheets when none does.
			...(
				[
					[10, 15, 16500, 33000],
					[15, 20, 31000, 62000],
					[20, 25, 50000, 98000],
					[25, 30, 74000, 145000]
				] as const
			).map(([l, w, cost, price]) =>
				item(
					`LINER-EPDM-${l}X${w}`,
					`EPDM pond liner, 45 mil, ${l} × ${w} ft`,
					'liner',
					'each',
					cost,
					price,
					{
						sheetLengthFt: w,
						sheetWidthFt: l,
						sheetFamily: 'epdm-45'
					}
				)
			),
			item('UNDERLAY-FT2', 'Liner underlayment, by the square foot', 'liner', 'ft2', 18, 45),
			item('SKIM-2000', 'Pond skimmer, rated 2,000 gph', 'filtration', 'each', 21000, 42000, {
				ratedFlowGph: 2000
			}),
			item('SKIM-5000', 'Pond skimmer, rated 5,000 gph', 'filtration', 'each', 32000, 64000, {
				ratedFlowGph: 5000
			}),
			item(
				'BIOFILTER-1500',
				'Biological filter, ponds to 1,500 gal',
				'filtration',
				'each',
				26000,
				52000,
				{
					ratedVolumeGal: 1500
				}
			),
			item(
				'BIOFILTER-4000',
				'Biological filter, ponds to 4,000 gal',
				'filtration',
				'each',
				39000,
				78000,
				{
					ratedVolumeGal: 4000
				}
			),
			item('WEIR-BOX-18', 'Waterfall weir box, 18 in', 'filtration', 'each', 17000, 36000),
			item('PIPE-FLEX-150', '1-1/2 in flexible PVC pipe', 'pipe', 'ft', 140, 290, {
				pipe: { material: 'flex-pvc', size: '1-1/2' }
			}),
			item('PIPE-FLEX-200', '2 in flexible PVC pipe', 'pipe', 'ft', 190, 390, {
				pipe: { material: 'flex-pvc', size: '2' }
			}),
			item('RESERVOIR-VAULT', 'Reservoir liner and pump vault', 'basin', 'each', 24000, 48000),
			item('AGG-STREAM-GRAVEL', 'Stream gravel, mixed 1–3 in', 'aggregate', 'ton', 5200, 10500, {
				bulkDensityLbFt3: 100
			}),
			item('STONE-BANK-BOULDER', 'Bank boulder, 12–18 in', 'stone', 'each', 4500, 9500),
			item('STONE-EDGE-FLAG', 'Flagstone pond edging', 'stone', 'ft2', 650, 1400),
			// Retaining-wall drainage, machines, deliveries and spoil (invented prices).
			item('PIPE-DRAIN-4', '4 in perforated drain pipe with sock', 'wall', 'ft', 90, 220),
			item('EQUIP-LOADER-DAY', 'Compact track loader, a day', 'equipment', 'day', 28000, 42000),
			item('EQUIP-EXCAVATOR-DAY', 'Mini excavator, a day', 'equipment', 'day', 38000, 57000),
			item('EQUIP-DELIVERY', 'Machine delivery and pick-up', 'equipment', 'each', 15000, 22500, {
				taxable: false
			}),
			item(
				'DELIVERY-LOAD',
				'Delivery of stone or aggregate, a load',
				'equipment',
				'load',
				9500,
				14000,
				{
					taxable: false
				}
			),
			item(
				'SPOIL-HAUL-YD3',
				'Haul away and dump spoil, loose yd³',
				'equipment',
				'yd3',
				3500,
				5500,
				{
					taxable: false
				}
			)
		],
		pumps: [
			{
				id: 'pump-s900',
				name: 'Submersible pump S-900',
				curve: [
					{ flowGph: 0, headFt: 12 },
					{ flowGph: 300, headFt: 10.2 },
					{ flowGph: 600, headFt: 7.4 },
					{ flowGph: 900, headFt: 3.6 },
					{ flowGph: 1050, headFt: 0 }
				],
				watts: 85,
				priceCents: 24000,
				costCents: 13000
			},
			{
				id: 'pump-s1600',
				name: 'Submersible pump S-1600',
				curve: [
					{ flowGph: 0, headFt: 16 },
					{ flowGph: 500, headFt: 13.8 },
					{ flowGph: 1000, headFt: 10 },
					{ flowGph: 1600, headFt: 4.5 },
					{ flowGph: 1850, headFt: 0 }
				],
				watts: 140,
				priceCents: 36000,
				costCents: 20000
			},
			{
				id: 'pump-s2600',
				name: 'Submersible pump S-2600',
				curve: [
					{ flowGph: 0, headFt: 21 },
					{ flowGph: 800, headFt: 18 },
					{ flowGph: 1600, headFt: 13 },
					{ flowGph: 2600, headFt: 5.5 },
					{ flowGph: 3000, headFt: 0 }
				],
				watts: 230,
				priceCents: 52000,
				costCents: 29000
			},
			{
				id: 'pump-s4000',
				name: 'Submersible pump S-4000',
				curve: [
					{ flowGph: 0, headFt: 26 },
					{ flowGph: 1200, headFt: 22 },
					{ flowGph: 2400, headFt: 16 },
					{ flowGph: 4000, headFt: 6 },
					{ flowGph: 4600, headFt: 0 }
				],
				watts: 360,
				priceCents: 78000,
				costCents: 44000
			}
		],
		laborRates: [
			{ id: 'installer', name: 'Installer', costPerHourCents: 3800, pricePerHourCents: 8500 }
		],
		settings: {
			markupPercent: 10,
			taxRatePercent: 7.25,
			taxAppliesTo: 'materials',
			depositPercent: 30,
			electricityCentsPerKwh: 14,
			evaporationInPerDay: 0.25,
			dailyRunHours: 12,
			seasonMonths: 7,
			labor: { rateId: 'installer' }
		}
	};
}
