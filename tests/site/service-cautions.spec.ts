/**
 * The prerendered service pages (run after `vite build`) carry the safety cautions for the work
 * they describe, each deferring to local codes and licensed practice, and still ship no script.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cautions } from '../../src/lib/content/cautions';

const root = join(import.meta.dirname, '..', '..');
const pre = join(root, process.env.BUILD_DIR ?? 'build', 'prerendered', 'services');
const page = (slug: string) => readFileSync(join(pre, `${slug}.html`), 'utf8');
const titles = (html: string) =>
	[...html.matchAll(/<h3 id="caution-([a-z]+)"/g)].map((m) => m[1]).sort();

describe('cautions on the prerendered service pages', () => {
	it('stone fountains warn about digging, the pump in water and the heavy stones', () => {
		const html = page('stone-fountains');
		expect(titles(html)).toEqual(['dig', 'electric', 'stones']);
		expect(html).toContain('Your local codes and licensed trades have the final word');
		const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
		expect(scripts.filter((tag) => !/type="application\/ld\+json"/.test(tag))).toEqual([]);
	});

	it('streams and ponds warn about open water and local rules', () => {
		const html = page('streams-and-ponds');
		expect(titles(html)).toEqual(['dig', 'electric', 'stones', 'water']);
		expect(html).toContain(cautions.water.title);
	});

	it('garden lighting says to call 811 before the cable trench and to use GFCI and an electrician', () => {
		const html = page('garden-lighting');
		expect(titles(html)).toEqual(['dig', 'electric']);
		expect(html).toContain('dial 811');
		expect(html).toContain('GFCI');
		expect(html).toContain('licensed electrician');
	});
});
