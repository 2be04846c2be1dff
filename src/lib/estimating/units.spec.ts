import convertUnits from 'convert-units';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	CUBIC_METERS_PER_US_GALLON,
	KILOGRAMS_PER_POUND,
	UNIT_FACTORS,
	convert,
	formatQuantity,
	fromSI,
	toSI,
	type Quantity
} from './units';

describe('unit definitions (NIST Handbook 44 Appendix C, NIST SP 811 Appendix B)', () => {
	it('US gallon is exactly 231 in³ = 3.785411784 L (NIST Handbook 44)', () => {
		expect(CUBIC_METERS_PER_US_GALLON * 1000).toBeCloseTo(3.785411784, 12);
		expect(convert(1, 'volume', 'gal', 'in3')).toBeCloseTo(231, 10);
	});

	it('pound is exactly 0.45359237 kg (NIST SP 811)', () => {
		expect(KILOGRAMS_PER_POUND).toBe(0.45359237);
		expect(convert(1, 'mass', 'lb', 'kg')).toBe(0.45359237);
	});

	it('cubic yard is 27 ft³ and a short ton 2000 lb (NIST Handbook 44)', () => {
		expect(convert(1, 'volume', 'yd3', 'ft3')).toBeCloseTo(27, 10);
		expect(convert(1, 'mass', 'ton', 'lb')).toBeCloseTo(2000, 9);
	});

	it('1 ft of water (39.2 °F) = 2988.98 Pa = 0.4335 psi, and 1 psi ≈ 2.307 ft (NIST SP 811)', () => {
		expect(convert(1, 'head', 'ft', 'psi')).toBeCloseTo(2988.98 / 6894.757, 10);
		expect(convert(1, 'head', 'ft', 'psi')).toBeCloseTo(0.4335, 4);
		expect(convert(1, 'head', 'psi', 'ft')).toBeCloseTo(2.3067, 3);
		expect(convert(1, 'head', 'm', 'kPa')).toBeCloseTo(9.80638, 3);
	});

	it('gpm = 60 gph and 1 gpm = 3.785411784 L/min', () => {
		expect(convert(1, 'flow', 'gpm', 'gph')).toBeCloseTo(60, 10);
		expect(convert(1, 'flow', 'gpm', 'L/min')).toBeCloseTo(3.785411784, 10);
	});
});

describe('cross-check against the convert-units package (general-purpose units library)', () => {
	const cases: [Quantity, string, string, string, string][] = [
		['length', 'ft', 'm', 'ft', 'm'],
		['length', 'in', 'cm', 'in', 'cm'],
		['area', 'ft2', 'm2', 'ft2', 'm2'],
		['volume', 'gal', 'L', 'gal', 'l'],
		['volume', 'yd3', 'm3', 'yd3', 'm3'],
		['volume', 'ft3', 'L', 'ft3', 'l'],
		['flow', 'gph', 'L/min', 'gal/h', 'l/min'],
		['flow', 'gpm', 'm3/h', 'gal/min', 'm3/h'],
		['mass', 'lb', 'kg', 'lb', 'kg'],
		['mass', 'ton', 'kg', 't', 'kg'],
		['velocity', 'ft/s', 'm/s', 'ft/s', 'm/s']
	];
	it.each(cases)('%s: %s → %s agrees to 1 part in 10⁵', (quantity, from, to, cuFrom, cuTo) => {
		const ours = convert(1, quantity, from as never, to as never);
		const theirs = convertUnits(1).from(cuFrom).to(cuTo);
		expect(Math.abs(ours - theirs) / theirs).toBeLessThan(1e-5);
	});

	it('psi → kPa agrees with convert-units (pressure)', () => {
		const oursKpa = convert(1, 'head', 'psi', 'kPa');
		expect(oursKpa).toBeCloseTo(convertUnits(1).from('psi').to('kPa'), 4);
	});
});

describe('conversion properties (fast-check)', () => {
	const quantities = Object.keys(UNIT_FACTORS) as Quantity[];
	it('converting there and back returns the value', () => {
		fc.assert(
			fc.property(
				fc.constantFrom(...quantities),
				fc.double({ min: -1e6, max: 1e6, noNaN: true }),
				(quantity, value) => {
					const units = Object.keys(UNIT_FACTORS[quantity]);
					for (const unit of units) {
						const back = fromSI(toSI(value, quantity, unit as never), quantity, unit as never);
						expect(back).toBeCloseTo(value, 6);
					}
				}
			)
		);
	});
});

describe('formatQuantity', () => {
	it('shows US customary by default and metric on request', () => {
		const flow = toSI(600, 'flow', 'gph');
		expect(formatQuantity(flow, 'flow').text).toBe('600 gph');
		expect(formatQuantity(flow, 'flow', 'metric').text).toBe('38 L/min');
		expect(formatQuantity(0.3048, 'head').text).toBe('1.0 ft of water');
		expect(formatQuantity(0.3048, 'head', 'metric').text).toBe('0.3 m of water');
		expect(formatQuantity(toSI(1, 'volume', 'yd3'), 'bulkVolume', 'metric').value).toBe(0.76);
	});
});
