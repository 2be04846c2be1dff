// One side of `npm run bench:photos`, in a process of its own: `node child.mjs app|bare <file>
// <runs>` (photos.ts bundles this file) runs one pipeline on the photo and prints one line of
// JSON: the median time and the process's peak resident memory (VmHWM).
import { readFileSync } from 'node:fs';
import sharp from 'sharp';
import { processPhoto } from '../../src/lib/server/platform/images';
import { medianMs } from './lib';

/** The same image steps with sharp's defaults: orient into a buffer, then two sizes from it. */
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

const peakMiB = () => {
	const status = readFileSync('/proc/self/status', 'utf8');
	return Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? 0) / 1024;
};

const [, , which, file, runs] = process.argv;
if (which === 'bare') {
	// The bare side keeps sharp's own defaults (cache, one thread per core).
	sharp.cache(true);
	sharp.concurrency(0);
}
const photo = readFileSync(file);
const idleMiB = peakMiB();
const run = which === 'app' ? () => processPhoto('yard.jpg', photo) : () => bare(photo);
const ms = await medianMs(run, Number(runs), 1);
console.log(JSON.stringify({ ms, peakMiB: peakMiB(), idleMiB }));
