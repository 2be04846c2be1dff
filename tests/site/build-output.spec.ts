/**
 * Checks the prerendered public site in build/ (run after `vite build`):
 * every project is a page, the sitemap and the pages agree, content pages ship no script,
 * JSON-LD parses and carries what schema.org consumers need, and no URL leaves the site.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const buildDir = process.env.BUILD_DIR ?? 'build';
const pre = join(root, buildDir, 'prerendered');
const client = join(root, buildDir, 'client');

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? walk(p) : [p];
	});
}

const htmlFiles = existsSync(pre) ? walk(pre).filter((f) => f.endsWith('.html')) : [];
const pages = new Map(
	htmlFiles.map((f) => {
		const rel = relative(pre, f).replace(/\.html$/, '');
		return [rel === 'index' ? '/' : '/' + rel, readFileSync(f, 'utf8')] as const;
	})
);

const home = pages.get('/') ?? '';
/** The origin the build was made for, read from the home page's canonical link. */
const origin = /<link rel="canonical" href="([^"]+?)\/?"/.exec(home)?.[1] ?? '';

const pathOf = (url: string) => {
	const u = new URL(url, origin + '/');
	return { sameHost: u.origin === origin, path: u.pathname };
};

function fileExists(path: string): boolean {
	const clean = decodeURIComponent(path);
	if (pages.has(clean)) return true;
	return [join(pre, clean), join(client, clean)].some((p) => existsSync(p) && statSync(p).isFile());
}

function jsonLd(html: string): Record<string, unknown>[] {
	return [...html.matchAll(/<script type="application\/ld\+json">([\s\S]*?)<\/script>/g)].map(
		(m) => JSON.parse(m[1]) as Record<string, unknown>
	);
}

/** Every string value in a JSON-LD tree that is a URL, except the @context vocabulary. */
function urlsIn(value: unknown, key = ''): string[] {
	if (typeof value === 'string') {
		return key !== '@context' && /^[a-z]+:\/\//i.test(value) ? [value] : [];
	}
	if (Array.isArray(value)) return value.flatMap((v) => urlsIn(v));
	if (value && typeof value === 'object') {
		return Object.entries(value).flatMap(([k, v]) => urlsIn(v, k));
	}
	return [];
}

/** URLs in attributes a browser or crawler would fetch or follow. */
function attributeUrls(html: string): string[] {
	const out: string[] = [];
	for (const m of html.matchAll(/\s(href|src|action|poster|data)="([^"]*)"/g)) out.push(m[2]);
	for (const m of html.matchAll(/\ssrcset="([^"]*)"/g)) {
		out.push(...m[1].split(',').map((s) => s.trim().split(/\s+/)[0]));
	}
	for (const m of html.matchAll(
		/<meta (?:property|name)="(?:og:[a-z:]+|twitter:[a-z:]+)" content="([^"]*)"/g
	)) {
		if (/^[a-z]+:\/\//i.test(m[1])) out.push(m[1]);
	}
	return out.filter(Boolean);
}

const projectSlugs = readdirSync(join(root, 'content', 'work'))
	.filter((f) => f.endsWith('.md'))
	.map((f) => f.replace(/\.md$/, ''));

describe('prerendered public site', () => {
	it('was built', () => {
		expect(pages.size, 'run `vite build` first').toBeGreaterThan(10);
		expect(origin).toMatch(/^https?:\/\/[^/]+$/);
	});

	it('turns every project file into a page', () => {
		for (const slug of projectSlugs) {
			const html = pages.get(`/work/${slug}`);
			expect(html, `/work/${slug}`).toBeDefined();
			expect(html).toContain(`href="/start?ref=${slug}"`);
		}
	});

	it('lists in the sitemap exactly the pages that exist, all on this origin', () => {
		const xml = readFileSync(join(pre, 'sitemap.xml'), 'utf8');
		const locs = [...xml.matchAll(/<loc>([^<]+)<\/loc>/g)].map((m) => m[1]);
		expect(locs.length).toBeGreaterThan(10);
		const paths = locs.map((l) => {
			expect(l.startsWith(origin + '/'), l).toBe(true);
			return pathOf(l).path;
		});
		for (const p of paths) expect(pages.has(p), `sitemap lists ${p}`).toBe(true);
		for (const p of pages.keys()) expect(paths, `${p} is missing from the sitemap`).toContain(p);
		expect(paths).toEqual(expect.arrayContaining(['/', '/work', '/guide', '/about', '/services']));
	});

	it('ships no script on content pages (JSON-LD data blocks aside)', () => {
		for (const [path, html] of pages) {
			const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
			const executable = scripts.filter((s) => !/type="application\/ld\+json"/.test(s));
			expect(executable, path).toEqual([]);
			expect(html, path).not.toMatch(/rel="modulepreload"/);
			expect(html, path).not.toMatch(/\son[a-z]+="/);
		}
	});

	it('gives every page a title, description, canonical URL and share image', () => {
		for (const [path, html] of pages) {
			expect(html, path).toMatch(/<title>[^<]{5,}<\/title>/);
			expect(html, path).toMatch(/<meta name="description" content="[^"]{40,}"/);
			expect(html, path).toContain(
				`<link rel="canonical" href="${origin}${path === '/' ? '/' : path}"`
			);
			expect(html, path).toMatch(/<meta property="og:image" content="[^"]+"/);
			expect(html, path).toMatch(/<meta name="twitter:card" content="summary_large_image"/);
			expect(html, path).toMatch(/<html lang="en"/);
		}
	});

	it('describes the firm as a local business with its service area', () => {
		const biz = jsonLd(home).find((d) => /Business$/.test(String(d['@type'])));
		expect(biz).toBeDefined();
		expect(biz!['@context']).toBe('https://schema.org');
		for (const key of ['name', 'url', 'telephone', 'address', 'areaServed', 'image']) {
			expect(biz, key).toHaveProperty(key);
		}
		expect((biz!.areaServed as unknown[]).length).toBeGreaterThan(3);
	});

	it('describes every project as a creative work with images', () => {
		for (const slug of projectSlugs) {
			const html = pages.get(`/work/${slug}`)!;
			const blocks = jsonLd(html);
			const work = blocks.find((d) => d['@type'] === 'CreativeWork');
			expect(work, slug).toBeDefined();
			for (const key of ['name', 'description', 'url', 'image', 'creator', 'dateCreated']) {
				expect(work, `${slug}: ${key}`).toHaveProperty(key);
			}
			const images = work!.image as { contentUrl: string }[];
			expect(images.length).toBeGreaterThan(0);
			for (const img of images) {
				expect(fileExists(pathOf(img.contentUrl).path), img.contentUrl).toBe(true);
			}
		}
	});

	it('parses every JSON-LD block on every page', () => {
		for (const [path, html] of pages) {
			const blocks = jsonLd(html);
			expect(blocks.length, path).toBeGreaterThan(0);
			for (const b of blocks) expect(b['@context'], path).toBe('https://schema.org');
		}
	});

	it('points no URL to another host, and every internal link resolves', () => {
		for (const [path, html] of pages) {
			const urls = [...attributeUrls(html), ...jsonLd(html).flatMap((d) => urlsIn(d))];
			for (const url of urls) {
				if (/^(mailto|tel):/.test(url) || url.startsWith('#')) continue;
				const { sameHost, path: target } = pathOf(url);
				expect(sameHost, `${path} links to ${url}`).toBe(true);
				// The inquiry page and the care sign-up have forms: they are server-rendered.
				if (target === '/start' || target === '/care') continue;
				expect(fileExists(target), `${path} links to missing ${target}`).toBe(true);
			}
		}
	});

	it('keeps stylesheets and the manifest on this host too', () => {
		const css = walk(join(client, '_app')).filter((f) => f.endsWith('.css'));
		for (const f of css) {
			expect(readFileSync(f, 'utf8'), f).not.toMatch(/url\(\s*["']?(https?:)?\/\//);
		}
		const manifest = JSON.parse(readFileSync(join(client, 'site.webmanifest'), 'utf8'));
		for (const icon of manifest.icons) expect(fileExists(icon.src), icon.src).toBe(true);
	});

	it('tells crawlers to stay out of the office, the API and token pages', () => {
		const robots = readFileSync(join(pre, 'robots.txt'), 'utf8');
		for (const p of ['/office', '/api', '/estimate', '/visit', '/change-order']) {
			expect(robots).toContain(`Disallow: ${p}`);
		}
		expect(robots).toContain(`Sitemap: ${origin}/sitemap.xml`);
	});

	it('sets width and height on every image and lazy-loads all but the first', () => {
		for (const [path, html] of pages) {
			const imgs = [...html.matchAll(/<img\b[^>]*>/g)].map((m) => m[0]);
			for (const img of imgs) {
				expect(img, path).toMatch(/\swidth="\d+"/);
				expect(img, path).toMatch(/\sheight="\d+"/);
				expect(img, path).toMatch(/\salt="/);
			}
			const eager = imgs.filter((i) => /loading="eager"/.test(i));
			expect(eager.length, path).toBeLessThanOrEqual(1);
			if (eager.length) expect(eager[0]).toMatch(/fetchpriority="high"/);
		}
	});
});
