import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { compile } from 'mdsvex';
import { describe, expect, it } from 'vitest';
import { ContentError, parsePage, parseProject, parseService } from './schema';

/** Front matter exactly as the build reads it: through mdsvex. */
async function frontMatter(source: string): Promise<unknown> {
	const out = await compile(source, {});
	return (out?.data as { fm?: unknown } | undefined)?.fm;
}

const ctx = {
	hasImage: (key: string) => ['demo-fountain/cover.jpg', 'demo-fountain/detail.jpg'].includes(key),
	services: new Set(['stone-fountains', 'garden-lighting'])
};

const good = `---
title: Demo fountain
slug: demo-fountain
town: Linden Ford
season: summer
year: 2024
types: [fountains, lighting]
summary: A drilled boulder over a hidden basin, used by the tests as a known good project file.
cover:
  file: cover.jpg
  alt: A drilled boulder with water bubbling from its top.
gallery:
  - file: detail.jpg
    alt: Close view of the bubbling top of the boulder.
facts:
  basinGallons: 120
  pumpGph: 900
  outlets: 1
  stones: [Granite]
services: [stone-fountains]
---

Body text.
`;

/** Replace one front-matter line (matched by its start) with another, or drop it. */
const edit = (from: string, to: string | null) =>
	good
		.split('\n')
		.flatMap((line) => (line.startsWith(from) ? (to === null ? [] : [to]) : [line]))
		.join('\n');

async function failure(file: string, source: string): Promise<ContentError> {
	const fm = await frontMatter(source);
	try {
		parseProject(file, fm, ctx);
	} catch (e) {
		expect(e).toBeInstanceOf(ContentError);
		return e as ContentError;
	}
	throw new Error(`${file} was accepted but should have failed`);
}

describe('project front matter', () => {
	it('accepts a well-formed file and fills defaults', async () => {
		const meta = parseProject('content/work/demo-fountain.md', await frontMatter(good), ctx);
		expect(meta.slug).toBe('demo-fountain');
		expect(meta.featured).toBe(false);
		expect(meta.gallery).toHaveLength(1);
	});

	const broken: [name: string, source: string, field: string, says: RegExp][] = [
		['missing-title', edit('title:', null), 'title', /required/],
		['unknown-type', edit('types:', 'types: [fountains, hot-tubs]'), 'types.1', /fountains/],
		['missing-image', edit('  file: cover.jpg', '  file: nowhere.jpg'), 'cover.file', /not found/],
		[
			'gallery-image',
			edit('  - file: detail.jpg', '  - file: gone.jpg'),
			'gallery.0.file',
			/gone\.jpg/
		],
		['street-address', edit('town:', 'town: 42 Elm Street'), 'town', /street address/],
		['bad-season', edit('season:', 'season: monsoon'), 'season', /spring|summer/],
		['year-as-text', edit('year:', 'year: last year'), 'year', /number/],
		['fact-typo', edit('  pumpGph:', '  pumpGPH: 900'), 'facts.pumpGPH', /unknown field/],
		['negative-fact', edit('  outlets:', '  outlets: -2'), 'facts.outlets', /0|negative/i],
		[
			'unknown-service',
			edit('services:', 'services: [hot-tub-repair]'),
			'services.0',
			/unknown service/
		],
		['short-alt', edit('  alt: A drilled', '  alt: rock'), 'cover.alt', /describe/],
		['wrong-slug', good, 'slug', /must match the file name/]
	];

	for (const [name, source, field, says] of broken) {
		it(`rejects ${name}.md, naming the file and the field "${field}"`, async () => {
			const file = `content/work/${name}.md`;
			const err = await failure(file, source);
			const problem = err.problems.find((p) => p.field === field);
			expect(problem, `${err.message}`).toBeDefined();
			expect(problem!.message).toMatch(says);
			expect(err.message).toContain(file);
			expect(err.message).toContain(`field "${field}"`);
		});
	}

	it('rejects a file with no front matter at all', async () => {
		const err = await failure('content/work/empty.md', 'Just some text.\n');
		expect(err.message).toContain('content/work/empty.md');
		expect(err.problems.map((p) => p.field)).toEqual(
			expect.arrayContaining(['title', 'slug', 'cover', 'facts'])
		);
	});

	it('rejects malformed services and pages with the file and field', () => {
		expect(() => parseService('content/services/x.md', { title: 'X', slug: 'x' })).toThrow(
			/content\/services\/x\.md: field "summary"/
		);
		expect(() => parsePage('content/pages/p.md', { title: 'Page' })).toThrow(
			/content\/pages\/p\.md: field "description"/
		);
	});
});

describe('the real content', () => {
	const root = join(import.meta.dirname, '..', '..', '..');
	const services = new Set(
		readdirSync(join(root, 'content/services')).map((f) => f.replace(/\.md$/, ''))
	);
	const files = readdirSync(join(root, 'content/work')).filter((f) => f.endsWith('.md'));

	it('has eight or more projects of varied kinds', async () => {
		expect(files.length).toBeGreaterThanOrEqual(8);
		const types = new Set<string>();
		for (const f of files) {
			const meta = parseProject(
				`content/work/${f}`,
				await frontMatter(readFileSync(join(root, 'content/work', f), 'utf8')),
				{
					hasImage: (key) => existsSync(join(root, 'src/lib/assets/work', key)),
					services
				}
			);
			meta.types.forEach((t) => types.add(t));
		}
		expect(types.size).toBeGreaterThanOrEqual(6);
	});

	it('every service file is valid', async () => {
		for (const f of readdirSync(join(root, 'content/services'))) {
			const fm = await frontMatter(readFileSync(join(root, 'content/services', f), 'utf8'));
			expect(parseService(`content/services/${f}`, fm).slug).toBe(f.replace(/\.md$/, ''));
		}
	});
});
