/**
 * Units. The engine works in SI (m, m², m³, m³/s, m of water, kg, m/s); designs arrive in US
 * customary units and results are shown in US customary by default, metric on request.
 */

// NIST SP 811 (2008) Appendix B.8 and NIST Handbook 44 Appendix C: the international inch is
// exactly 0.0254 m, the foot exactly 0.3048 m.
export const METERS_PER_INCH = 0.0254;
export const METERS_PER_FOOT = 0.3048;
// NIST Handbook 44 Appendix C: the US liquid gallon is exactly 231 cubic inches.
export const CUBIC_INCHES_PER_US_GALLON = 231;
export const CUBIC_METERS_PER_US_GALLON = CUBIC_INCHES_PER_US_GALLON * METERS_PER_INCH ** 3;
// NIST SP 811 Appendix B.8: the avoirdupois pound is exactly 0.45359237 kg.
export const KILOGRAMS_PER_POUND = 0.45359237;
// NIST Handbook 44 Appendix C: 1 cubic yard = 27 cubic feet; 1 short ton = 2000 lb.
export const CUBIC_FEET_PER_CUBIC_YARD = 27;
export const POUNDS_PER_SHORT_TON = 2000;
// NIST SP 811 Appendix B.8: pound-force per square inch = 6.894757 E+03 Pa.
export const PASCALS_PER_PSI = 6894.757;
// NIST SP 811 Appendix B.8: foot of water (39.2 °F) = 2.98898 E+03 Pa.
export const PASCALS_PER_FOOT_OF_WATER = 2988.98;
export const PASCALS_PER_METER_OF_WATER = PASCALS_PER_FOOT_OF_WATER / METERS_PER_FOOT;
// NIST SP 811 Appendix B.8 (standard acceleration of gravity, 3rd CGPM 1901): exactly 9.80665 m/s².
export const STANDARD_GRAVITY = 9.80665;
// Mean Gregorian year of 365.2425 days (ISO 8601 calendar) over 12 months.
export const DAYS_PER_MONTH = 365.2425 / 12;

const ft = METERS_PER_FOOT;
const inch = METERS_PER_INCH;
const gal = CUBIC_METERS_PER_US_GALLON;

/** Factor from each unit to the SI unit of its quantity. */
export const UNIT_FACTORS = {
	length: { m: 1, mm: 0.001, cm: 0.01, in: inch, ft, yd: 3 * ft },
	area: { m2: 1, in2: inch ** 2, ft2: ft ** 2, yd2: (3 * ft) ** 2 },
	volume: { m3: 1, L: 0.001, in3: inch ** 3, ft3: ft ** 3, yd3: (3 * ft) ** 3, gal },
	flow: { 'm3/s': 1, 'm3/h': 1 / 3600, 'L/min': 0.001 / 60, gph: gal / 3600, gpm: gal / 60 },
	head: {
		m: 1,
		ft,
		psi: PASCALS_PER_PSI / PASCALS_PER_METER_OF_WATER,
		kPa: 1000 / PASCALS_PER_METER_OF_WATER
	},
	mass: {
		kg: 1,
		lb: KILOGRAMS_PER_POUND,
		ton: POUNDS_PER_SHORT_TON * KILOGRAMS_PER_POUND,
		tonne: 1000
	},
	velocity: { 'm/s': 1, 'ft/s': ft },
	density: { 'kg/m3': 1, 'lb/ft3': KILOGRAMS_PER_POUND / ft ** 3, 'g/cm3': 1000 }
} as const;

export type Quantity = keyof typeof UNIT_FACTORS;
export type UnitOf<Q extends Quantity> = keyof (typeof UNIT_FACTORS)[Q] & string;

export function toSI<Q extends Quantity>(value: number, quantity: Q, unit: UnitOf<Q>): number {
	return value * (UNIT_FACTORS[quantity] as Record<string, number>)[unit];
}

export function fromSI<Q extends Quantity>(value: number, quantity: Q, unit: UnitOf<Q>): number {
	return value / (UNIT_FACTORS[quantity] as Record<string, number>)[unit];
}

export function convert<Q extends Quantity>(
	value: number,
	quantity: Q,
	from: UnitOf<Q>,
	to: UnitOf<Q>
): number {
	return fromSI(toSI(value, quantity, from), quantity, to);
}

export const inches = (value: number) => value * inch;
export const feet = (value: number) => value * ft;
export const gph = (value: number) => toSI(value, 'flow', 'gph');
export const toFeet = (meters: number) => meters / ft;
export const toInches = (meters: number) => meters / inch;
export const toGph = (m3s: number) => fromSI(m3s, 'flow', 'gph');
export const toGpm = (m3s: number) => fromSI(m3s, 'flow', 'gpm');

export type UnitSystem = 'us' | 'metric';

/** Display kinds and the unit each system shows them in. */
export const DISPLAY_UNITS = {
	length: { us: ['length', 'ft'], metric: ['length', 'm'] },
	shortLength: { us: ['length', 'in'], metric: ['length', 'mm'] },
	area: { us: ['area', 'ft2'], metric: ['area', 'm2'] },
	volume: { us: ['volume', 'gal'], metric: ['volume', 'L'] },
	bulkVolume: { us: ['volume', 'yd3'], metric: ['volume', 'm3'] },
	flow: { us: ['flow', 'gph'], metric: ['flow', 'L/min'] },
	head: { us: ['head', 'ft'], metric: ['head', 'm'] },
	pressure: { us: ['head', 'psi'], metric: ['head', 'kPa'] },
	mass: { us: ['mass', 'lb'], metric: ['mass', 'kg'] },
	bulkMass: { us: ['mass', 'ton'], metric: ['mass', 'tonne'] },
	velocity: { us: ['velocity', 'ft/s'], metric: ['velocity', 'm/s'] }
} as const satisfies Record<string, Record<UnitSystem, readonly [Quantity, string]>>;

export type DisplayKind = keyof typeof DISPLAY_UNITS;

const UNIT_LABELS: Record<string, string> = {
	ft2: 'ft²',
	m2: 'm²',
	yd3: 'yd³',
	m3: 'm³',
	ft: 'ft',
	m: 'm',
	ton: 'tons',
	tonne: 't'
};

export interface Formatted {
	value: number;
	unit: string;
	text: string;
}

const DEFAULT_DECIMALS: Record<DisplayKind, number> = {
	length: 1,
	shortLength: 1,
	area: 1,
	volume: 0,
	bulkVolume: 2,
	flow: 0,
	head: 1,
	pressure: 2,
	mass: 0,
	bulkMass: 2,
	velocity: 1
};

/** Converts an SI value for display, rounded to the kind's usual decimals unless told. */
export function formatQuantity(
	si: number,
	kind: DisplayKind,
	system: UnitSystem = 'us',
	decimals = DEFAULT_DECIMALS[kind]
): Formatted {
	const [quantity, unit] = DISPLAY_UNITS[kind][system];
	const value = fromSI(si, quantity, unit as UnitOf<typeof quantity>);
	const label = kind === 'head' ? `${UNIT_LABELS[unit]} of water` : (UNIT_LABELS[unit] ?? unit);
	const rounded = Number(value.toFixed(decimals));
	return { value: rounded, unit: label, text: `${value.toFixed(decimals)} ${label}` };
}
