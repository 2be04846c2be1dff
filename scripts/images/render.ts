/**
 * Renders the demo pictures: drawn SVG scenes → JPEG in src/lib/assets/work/<slug>/, plus the
 * favicon set and the share image in static/. Run: `npx tsx scripts/images/render.ts`.
 * The output is committed; enhanced-img makes the AVIF/WebP sets from it at build time.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';
import { svg, type Time } from './draw';
import { scenes } from './scenes';
import { faviconSvg, ico } from './icons';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const workDir = join(root, 'src', 'lib', 'assets', 'work');
const staticDir = join(root, 'static');

interface Shot {
	file: string;
	time: Time;
	zoom?: { x: number; y: number; k: number };
}

/** Which pictures each project gets: the cover first, then the gallery. */
export const plan: Record<string, Shot[]> = {
	'slate-spillway': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'spillway-lip.jpg', time: 'day', zoom: { x: 800, y: 600, k: 2 } },
		{ file: 'at-dusk.jpg', time: 'dusk' }
	],
	'granite-boulder-trio': [
		{ file: 'cover.jpg', time: 'dusk' },
		{ file: 'bubbling-tops.jpg', time: 'day', zoom: { x: 820, y: 560, k: 1.8 } },
		{ file: 'daylight.jpg', time: 'day' }
	],
	'hillside-pondless-stream': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'lower-falls.jpg', time: 'day', zoom: { x: 1000, y: 800, k: 1.9 } },
		{ file: 'top-of-the-run.jpg', time: 'day', zoom: { x: 480, y: 450, k: 1.7 } }
	],
	'wildlife-pond': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'lily-shelf.jpg', time: 'day', zoom: { x: 1080, y: 760, k: 2 } },
		{ file: 'pebble-beach.jpg', time: 'day', zoom: { x: 380, y: 760, k: 1.8 } }
	],
	'courtyard-wall-spout': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'copper-spout.jpg', time: 'day', zoom: { x: 880, y: 440, k: 2.1 } },
		{ file: 'evening.jpg', time: 'dusk' }
	],
	'lit-terrace-seat-wall': [
		{ file: 'cover.jpg', time: 'dusk' },
		{ file: 'daytime.jpg', time: 'day' },
		{ file: 'cap-lights.jpg', time: 'dusk', zoom: { x: 560, y: 500, k: 2 } }
	],
	'flagstone-garden-path': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'thyme-joints.jpg', time: 'day', zoom: { x: 820, y: 860, k: 1.9 } },
		{ file: 'far-end.jpg', time: 'day', zoom: { x: 780, y: 520, k: 1.6 } }
	],
	'dry-creek-downspout': [
		{ file: 'cover.jpg', time: 'day' },
		{ file: 'bridge-stone.jpg', time: 'day', zoom: { x: 900, y: 800, k: 1.9 } },
		{ file: 'downspout-outfall.jpg', time: 'day', zoom: { x: 470, y: 620, k: 1.8 } }
	],
	'basalt-column-trio': [
		{ file: 'cover.jpg', time: 'dusk' },
		{ file: 'column-tops.jpg', time: 'day', zoom: { x: 800, y: 450, k: 2 } },
		{ file: 'daylight.jpg', time: 'day' }
	]
};

async function jpeg(svgText: string, out: string, width = 1600, height?: number) {
	mkdirSync(dirname(out), { recursive: true });
	let img = sharp(Buffer.from(svgText), { density: 72 });
	if (height) img = img.resize(width, height, { fit: 'cover', position: 'centre' });
	const buf = await img.jpeg({ quality: 78, mozjpeg: true, progressive: true }).toBuffer();
	writeFileSync(out, buf);
	return buf.length;
}

async function main() {
	const only = process.argv[2];
	let total = 0;
	for (const [slug, shots] of Object.entries(plan)) {
		if (only && only !== slug) continue;
		const scene = scenes[slug];
		if (!scene) throw new Error(`No scene drawn for ${slug}`);
		for (const shot of shots) {
			const bytes = await jpeg(
				svg(scene.draw(shot.time), shot.zoom),
				join(workDir, slug, shot.file)
			);
			total += bytes;
			console.log(`${slug}/${shot.file}  ${(bytes / 1024).toFixed(0)} KB`);
		}
	}
	// The share image for pages without their own: a 1200×630 crop of one scene.
	total += await jpeg(
		svg(scenes['granite-boulder-trio'].draw('dusk')),
		join(staticDir, 'og-image.jpg'),
		1200,
		630
	);

	// Favicon set from one drawn mark.
	const mark = faviconSvg();
	writeFileSync(join(staticDir, 'favicon.svg'), mark);
	const png = (size: number, pad = 0) =>
		sharp(Buffer.from(mark), { density: 300 })
			.resize(size - pad * 2, size - pad * 2)
			.extend({ top: pad, bottom: pad, left: pad, right: pad, background: '#fbf8f2' })
			.png()
			.toBuffer();
	writeFileSync(join(staticDir, 'apple-touch-icon.png'), await png(180, 10));
	writeFileSync(join(staticDir, 'icon-192.png'), await png(192));
	writeFileSync(join(staticDir, 'icon-512.png'), await png(512));
	writeFileSync(join(staticDir, 'icon-maskable-512.png'), await png(512, 64));
	writeFileSync(join(staticDir, 'favicon.ico'), ico([await png(32), await png(16)], [32, 16]));
	console.log(`total ${(total / 1024 / 1024).toFixed(2)} MB of pictures`);
}

await main();
