import { describe, expect, it } from 'vitest';
import { settingsSchema, type Wall } from './schema';
import { buriedCourses, wallTakeoff } from './walls';
import { fromSI, toInches } from './units';

const settings = settingsSchema.parse({});

const wall = (overrides: Partial<Wall> = {}): Wall => ({
	id: 'w',
	name: 'Wall',
	purpose: 'retaining',
	lengthFt: 40,
	exposedHeightIn: 18,
	unit: { lengthIn: 16, heightIn: 6, depthIn: 12 },
	unitSku: 'U',
	capSku: 'C',
	capLengthIn: 16,
	surcharge: false,
	...overrides
});

describe('courses and units (common practice, no source: bury 6 in or H/8, at least one course)', () => {
	it('an 18 in wall of 6 in units buries one course and stands four courses high', () => {
		expect(buriedCourses(18, 6)).toBe(1);
		const r = wallTakeoff(wall(), settings);
		expect(r.courses).toBe(4);
		expect(r.unitsPerCourse).toBe(30);
		// 4 × 30 = 120 units, plus 5% waste = 126.
		expect(r.units).toBe(126);
		expect(r.caps).toBe(30);
	});

	it('a 64 in wall buries 8 in, two 6 in courses; a 12 in wall of 4 in units buries the 6 in minimum, two courses', () => {
		expect(buriedCourses(64, 6)).toBe(2);
		expect(buriedCourses(12, 4)).toBe(2);
	});

	it('a seat wall buries a course too, with drainage stone beside it only, and no drain pipe', () => {
		const r = wallTakeoff(wall({ purpose: 'seat' }), settings);
		expect(r.buriedCourses).toBe(1);
		expect(r.courses).toBe(4);
		// 40 ft × 6 in × one 6 in course = 10 ft³ (common practice, no source).
		expect(fromSI(r.drainVolumeM3, 'volume', 'ft3')).toBeCloseTo(10, 9);
		expect(r.drainPipeLengthM).toBe(0);
	});
});

describe('base and drainage (pad 6 in deep and 12 in wider, 12 in drainage zone: common practice, no source)', () => {
	it('levelling pad: 40 ft × (12 + 12 in) × 6 in = 40 ft³ (common practice, no source)', () => {
		expect(fromSI(wallTakeoff(wall(), settings).padVolumeM3, 'volume', 'ft3')).toBeCloseTo(40, 9);
	});

	it('drainage stone: 12 in deep behind the full built height, 40 ft × 1 ft × 2 ft = 80 ft³ (common practice, no source)', () => {
		expect(fromSI(wallTakeoff(wall(), settings).drainVolumeM3, 'volume', 'ft3')).toBeCloseTo(80, 9);
	});

	it('the pad is bought loose: 40 ft³ compacted × 1.11 / 0.95 = 46.7 ft³ (US Army FM 5-434, Earthmoving Operations, table 1-2: 100 yd³ of sand in place is 111 yd³ loose, 95 yd³ compacted)', () => {
		const r = wallTakeoff(wall(), settings);
		expect(fromSI(r.padLooseVolumeM3, 'volume', 'ft3')).toBeCloseTo((40 * 1.11) / 0.95, 9);
	});

	it('a retaining wall drains through a pipe its length plus 10 ft to daylight (common practice, no source)', () => {
		expect(fromSI(wallTakeoff(wall(), settings).drainPipeLengthM, 'length', 'ft')).toBeCloseTo(
			50,
			9
		);
	});

	it('the trench takes the pad and the buried course: 40 ft × 2 ft × (6 + 6 in) = 80 ft³; the face is 40 ft × 4 courses of 6 in = 80 ft²', () => {
		const r = wallTakeoff(wall(), settings);
		expect(fromSI(r.trenchVolumeM3, 'volume', 'ft3')).toBeCloseTo(80, 9);
		expect(fromSI(r.faceAreaM2, 'area', 'ft2')).toBeCloseTo(80, 9);
	});
});

describe('permit and engineering thresholds', () => {
	it('IRC R105.2: over 4 ft from the bottom of the footing needs a permit', () => {
		// 42 in exposed: 1 buried course + 7 courses = 48 in of units + 6 in pad = 54 in.
		const r = wallTakeoff(wall({ exposedHeightIn: 42 }), settings);
		expect(toInches(r.heightFromFootingM)).toBeCloseTo(54, 9);
		expect(r.needsPermit).toBe(true);
		expect(r.needsEngineering).toBe(false);
	});

	it('IRC R404.4: over 48 in of unbalanced fill needs an engineered design', () => {
		expect(wallTakeoff(wall({ exposedHeightIn: 48 }), settings).needsEngineering).toBe(false);
		expect(wallTakeoff(wall({ exposedHeightIn: 50 }), settings).needsEngineering).toBe(true);
	});

	it('IRC R404.4: over 24 in with a surcharge needs a design; R105.2: a surcharge needs a permit', () => {
		const r = wallTakeoff(wall({ exposedHeightIn: 30, surcharge: true }), settings);
		expect(r.needsEngineering).toBe(true);
		expect(r.needsPermit).toBe(true);
	});

	it('a low wall needs neither, and a seat wall is not a retaining wall', () => {
		const low = wallTakeoff(wall(), settings);
		expect(low.needsPermit || low.needsEngineering).toBe(false);
		const seat = wallTakeoff(wall({ purpose: 'seat', exposedHeightIn: 60 }), settings);
		expect(seat.needsPermit || seat.needsEngineering).toBe(false);
	});
});

describe('wall units weighed for the truckloads (125 lb/ft³: ASTM C90 normal weight, from memory)', () => {
	it('a 16 × 6 × 12 in unit weighs 83.3 lb, a 16 in cap 4 in thick 55.6 lb: 126 units and 30 caps', () => {
		const r = wallTakeoff(wall(), settings);
		// Worked by hand: 16 × 6 × 12 in = 1,152 in³ = 0.667 ft³ × 125 lb/ft³ = 83.33 lb;
		// a cap 16 × 12 × 4 in = 768 in³ = 0.444 ft³ × 125 = 55.56 lb.
		expect(fromSI(r.unitsMassKg, 'mass', 'lb')).toBeCloseTo(126 * 83.333, 1);
		expect(fromSI(r.capsMassKg, 'mass', 'lb')).toBeCloseTo(30 * 55.556, 1);
		expect(wallTakeoff(wall({ capSku: undefined }), settings).capsMassKg).toBe(0);
	});
});
