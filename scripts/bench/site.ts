/**
 * Lighthouse benchmark of the public site (not a test). Runs Lighthouse 12.2.3 in Debian's
 * Chromium, mobile settings, against a running production server:
 *
 *   npx tsx scripts/bench/site.ts http://127.0.0.1:3300      (or BASE_URL=… npx tsx …)
 *
 * Prints performance, accessibility, best-practices and SEO scores, LCP, CLS, total bytes and
 * script bytes for the home page, the work index and one project page, and writes them to
 * bench/results/site.json. Goals: performance ≥ 95, accessibility and SEO 100,
 * home page ≤ 250 KB in all, 0 KB of script on content pages.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as chromeLauncher from 'chrome-launcher';
import lighthouse from 'lighthouse';

const base = (process.argv[2] ?? process.env.BASE_URL ?? 'http://127.0.0.1:3300').replace(
	/\/$/,
	''
);
const pages = [
	{ name: 'home', path: '/' },
	{ name: 'work index', path: '/work' },
	{ name: 'project', path: '/work/granite-boulder-trio' }
];
const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const out = join(root, 'bench', 'results', 'site.json');

interface Row {
	page: string;
	url: string;
	performance: number;
	accessibility: number;
	bestPractices: number;
	seo: number;
	lcpMs: number;
	cls: number;
	totalKB: number;
	scriptKB: number;
	failing: string[];
}

const chrome = await chromeLauncher.launch({
	chromePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
	chromeFlags: [
		'--headless=new',
		'--no-sandbox',
		'--disable-gpu',
		'--disable-background-networking',
		'--disable-component-update',
		'--disable-sync',
		'--no-first-run'
	]
});

const rows: Row[] = [];
try {
	for (const p of pages) {
		const url = base + p.path;
		const result = await lighthouse(url, {
			port: chrome.port,
			output: 'json',
			logLevel: 'error',
			formFactor: 'mobile',
			onlyCategories: ['performance', 'accessibility', 'best-practices', 'seo']
		});
		if (!result) throw new Error(`Lighthouse returned nothing for ${url}`);
		const lhr = result.lhr;
		const score = (id: string) => Math.round((lhr.categories[id]?.score ?? 0) * 100);
		const items =
			(
				lhr.audits['resource-summary']?.details as {
					items?: { resourceType: string; transferSize: number }[];
				}
			)?.items ?? [];
		const size = (type: string) =>
			(items.find((i) => i.resourceType === type)?.transferSize ?? 0) / 1024;
		const failing = Object.values(lhr.categories)
			.flatMap((c) => c.auditRefs)
			.map((ref) => lhr.audits[ref.id])
			.filter(
				(a) =>
					a &&
					a.score !== null &&
					a.score < 0.9 &&
					a.scoreDisplayMode !== 'informative' &&
					a.scoreDisplayMode !== 'notApplicable'
			)
			.map((a) => a.id);
		rows.push({
			page: p.name,
			url,
			performance: score('performance'),
			accessibility: score('accessibility'),
			bestPractices: score('best-practices'),
			seo: score('seo'),
			lcpMs: Math.round(lhr.audits['largest-contentful-paint']?.numericValue ?? 0),
			cls: Number((lhr.audits['cumulative-layout-shift']?.numericValue ?? 0).toFixed(3)),
			totalKB: Number(size('total').toFixed(1)),
			scriptKB: Number(size('script').toFixed(1)),
			failing: [...new Set(failing)]
		});
	}
} finally {
	chrome.kill();
}

console.table(rows.map(({ failing: _f, url: _u, ...r }) => r));
for (const r of rows) {
	if (r.failing.length) console.log(`${r.page}: audits below 0.9: ${r.failing.join(', ')}`);
}
mkdirSync(dirname(out), { recursive: true });
writeFileSync(
	out,
	JSON.stringify(
		{
			lighthouse: '12.2.3',
			settings: 'mobile (default throttling)',
			base,
			at: new Date().toISOString(),
			pages: rows
		},
		null,
		2
	) + '\n'
);
console.log(`written ${out}`);
