import { describe, expect, it } from 'vitest';
import { cautionsFor, type CautionFacts } from './cautions';

const facts = (overrides: Partial<CautionFacts> = {}): CautionFacts => ({
	digs: false,
	hasPump: false,
	hasLighting: false,
	stonesNeedingHelp: [],
	wallsNeedingPermit: [],
	wallsNeedingEngineering: [],
	openWaterDepthM: 0,
	openWaterLimitM: 0.6096,
	...overrides
});

const ids = (f: CautionFacts) => cautionsFor(f).map((c) => c.id);

describe('cautions', () => {
	it('always end with the line deferring to local codes and licensed practice', () => {
		expect(ids(facts())).toEqual(['local-codes']);
		expect(cautionsFor(facts({ digs: true, hasPump: true })).at(-1)!.reason).toMatch(/Local codes/);
	});

	it('digging brings the utility-locating notice: in the US call 811 and wait', () => {
		const locate = cautionsFor(facts({ digs: true }))[0];
		expect(locate.id).toBe('locate-utilities');
		expect(locate.reference).toMatch(/811/);
		expect(locate.reference).toMatch(/wait/);
	});

	it('a pump or lights bring ground-fault protection (NEC 680, 411) and a licensed electrician', () => {
		const list = cautionsFor(facts({ hasLighting: true }));
		expect(list.map((c) => c.id)).toEqual([
			'ground-fault-protection',
			'licensed-electrician',
			'local-codes'
		]);
		expect(list[0].reference).toMatch(/Article 680/);
		expect(list[0].reference).toMatch(/Article 411/);
	});

	it('heavy stones cite NIOSH 94-110 and name the stones', () => {
		const heavy = cautionsFor(facts({ stonesNeedingHelp: ['Tall column'] }))[0];
		expect(heavy.reason).toMatch(/Tall column/);
		expect(heavy.reference).toMatch(/94-110/);
	});

	it('wall height cites IRC R404.4 and R105.2', () => {
		const wall = cautionsFor(
			facts({ wallsNeedingPermit: ['Terrace wall'], wallsNeedingEngineering: ['Terrace wall'] })
		)[0];
		expect(wall.reason).toMatch(/^Terrace wall retains more/);
		expect(wall.reference).toMatch(/R404\.4/);
		expect(wall.reference).toMatch(/R105\.2/);
	});

	it('open water warns about children, and asks for a barrier past the depth limit', () => {
		expect(cautionsFor(facts({ openWaterDepthM: 0.3 }))[0].reason).toMatch(/grate/);
		expect(cautionsFor(facts({ openWaterDepthM: 0.9 }))[0].reason).toMatch(/barrier/);
	});
});
