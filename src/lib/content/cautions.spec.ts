import { describe, expect, it } from 'vitest';
import { cautions, cautionsForService } from './cautions';

// The services' own front matter types (content/services/*.md).
const stoneFountains = { types: ['fountains'] as const };
const streamsAndPonds = { types: ['streams', 'ponds'] as const };
const lighting = { types: ['lighting'] as const };
const walls = { types: ['walls', 'paths'] as const };

describe('cautions on the service pages, by the kind of work', () => {
	it('stone fountains: digging, a pump in water and heavy stones, but no open water', () => {
		expect(cautionsForService(stoneFountains)).toEqual(['dig', 'electric', 'stones']);
	});

	it('streams and ponds add open water, which defers to local rules', () => {
		expect(cautionsForService(streamsAndPonds)).toEqual(['dig', 'electric', 'stones', 'water']);
		expect(cautions.water.text).toMatch(/local rules/);
	});

	it('lighting: call before digging the cable trench, GFCI and a licensed electrician', () => {
		expect(cautionsForService(lighting)).toEqual(['dig', 'electric']);
		expect(cautions.dig.text).toMatch(/811/);
		expect(cautions.electric.text).toMatch(/GFCI/);
		expect(cautions.electric.text).toMatch(/licensed electrician/);
	});

	it('walls need the engineer caution, and a service with no work that digs shows none', () => {
		expect(cautionsForService(walls)).toEqual(['dig', 'walls']);
		expect(cautionsForService({ types: [] })).toEqual([]);
	});
});
