// `npm run bench:photos`: the app's photo pipeline (sniff, checks, orient, strip, two sizes)
// against a bare sharp script doing the same image steps, on the same 12-megapixel photo.
import sharp from 'sharp';
import { processPhoto } from '../../src/lib/server/images';
import { medianMs, writeResult } from './lib';

// A noisy 4000 × 3000 JPEG (noise keeps the encoder honest), with a sideways orientation tag.
const raw = Buffer.alloc(4000 * 3000 * 3);
for (let i = 0; i < raw.length; i++) raw[i] = (i * 2654435761) >>> 24;
const photo = await sharp(raw, { raw: { width: 4000, height: 3000, channels: 3 } })
	.jpeg({ quality: 85 })
	.withMetadata({ orientation: 6 })
	.toBuffer();

async function bare(input: Buffer) {
	const oriented = await sharp(input, { limitInputPixels: 40_000_000 }).autoOrient().toBuffer();
	await sharp(oriented)
		.resize(2048, 2048, { fit: 'inside', withoutEnlargement: true })
		.webp({ quality: 82 })
		.toBuffer();
	await sharp(oriented)
		.resize(480, 480, { fit: 'inside', withoutEnlargement: true })
		.webp({ quality: 74 })
		.toBuffer();
}

const runs = Number(process.argv[2] ?? 12);
// Interleaved so that machine noise falls on both sides alike.
const app: number[] = [];
const baseline: number[] = [];
for (let i = 0; i < runs; i++) {
	app.push(await medianMs(() => processPhoto('yard.jpg', photo), 1, i === 0 ? 1 : 0));
	baseline.push(await medianMs(() => bare(photo), 1, i === 0 ? 1 : 0));
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const appMs = median(app);
const bareMs = median(baseline);
const rssMb = process.memoryUsage().rss / 1e6;
console.log(
	`photo pipeline: median ${appMs.toFixed(0)} ms; bare sharp: ${bareMs.toFixed(0)} ms; ratio ${(appMs / bareMs).toFixed(2)}; rss ${rssMb.toFixed(0)} MB (${(photo.length / 1e6).toFixed(1)} MB input, ${runs} runs)`
);
writeResult('photos', {
	appMedianMs: appMs,
	bareSharpMedianMs: bareMs,
	ratio: appMs / bareMs,
	rssMb,
	inputBytes: photo.length,
	runs
});
