// `npm run bench:photos`: the app's photo pipeline (sniff, checks, orient, strip, two sizes)
// against a bare sharp script doing the same image steps, on a 12-megapixel photo and on the
// largest photo the app accepts (40 megapixels, under the 15 MB limit). Each pipeline runs in a
// child process of its own (photos-child.ts, bundled to plain JavaScript), so its peak resident
// memory (the kernel's VmHWM) is its own and not the bench's, which makes the test photos.
// Goal: the app's peak under 200 MiB for the largest photo, with the process environment the
// server starts with (SERVER_ENV in scripts/lib/production.ts: glibc limited to two allocation
// arenas); the script exits 1 when it is above. The same pipeline with glibc's defaults is shown
// beside it.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { SERVER_ENV } from '../lib/production';
import { PHOTO_LIMITS } from '../../src/lib/schema/intake';
import { build } from 'esbuild';
import { PIXEL_LIMIT } from '../../src/lib/server/platform/images';
import { writeResult } from './lib';

const GOAL_MIB = 200;

/** A noisy JPEG (noise keeps the encoder honest) with a sideways orientation tag. */
async function noisyJpeg(width: number, height: number, quality: number): Promise<Buffer> {
	const raw = Buffer.alloc(width * height * 3);
	for (let i = 0; i < raw.length; i++) raw[i] = ((i * 2654435761) >>> 24) & (i % 3 ? 0xff : 0x3f);
	return sharp(raw, { raw: { width, height, channels: 3 } })
		.jpeg({ quality })
		.withMetadata({ orientation: 6 })
		.toBuffer();
}

interface Side {
	ms: number;
	peakMiB: number;
	idleMiB: number;
}

function child(
	which: 'app' | 'bare',
	file: string,
	runs: number,
	env: Record<string, string> = {}
): Side {
	const out = spawnSync(process.execPath, [childFile, which, file, String(runs)], {
		env: { ...process.env, ...env },
		encoding: 'utf8',
		stdio: ['ignore', 'pipe', 'inherit']
	});
	if (out.status !== 0) throw new Error(`the ${which} child failed (exit ${out.status})`);
	return JSON.parse(out.stdout.trim().split('\n').at(-1)!);
}

const runs = Number(process.argv[2] ?? 8);
const dir = mkdtempSync(join(tmpdir(), 'rillstone-photos-'));
// Inside the project, so that the child finds sharp in node_modules.
const childFile = join(
	import.meta.dirname,
	'..',
	'..',
	'node_modules',
	'.cache',
	'bench-photos-child.mjs'
);
const load = () =>
	loadavg()
		.map((l) => l.toFixed(2))
		.join(' ');
try {
	// The child runs as plain JavaScript, as the app does (tsx alone would add some 60 MiB).
	await build({
		entryPoints: [join(import.meta.dirname, 'photos-child.ts')],
		bundle: true,
		platform: 'node',
		format: 'esm',
		external: ['sharp'],
		outfile: childFile,
		logLevel: 'warning'
	});
	// The largest photo the app takes: just under 40 megapixels at 3:2, and under the byte limit.
	const side = Math.floor(Math.sqrt(PIXEL_LIMIT / 6));
	let largest = await noisyJpeg(3 * side, 2 * side, 60);
	for (let q = 50; largest.length > PHOTO_LIMITS.maxBytes && q >= 20; q -= 10) {
		largest = await noisyJpeg(3 * side, 2 * side, q);
	}
	const photos = [
		{ name: '12 MP', file: join(dir, '12mp.jpg'), bytes: await noisyJpeg(4000, 3000, 85) },
		{
			name: `${((3 * side * 2 * side) / 1e6).toFixed(1)} MP (largest)`,
			file: join(dir, 'largest.jpg'),
			bytes: largest
		}
	];
	const results = [];
	let missed = false;
	for (const p of photos) {
		writeFileSync(p.file, p.bytes);
		// Interleaved in pairs so that machine noise falls on both sides alike.
		const app = child('app', p.file, runs, { MALLOC_ARENA_MAX: SERVER_ENV.MALLOC_ARENA_MAX });
		const baseline = child('bare', p.file, runs);
		const glibcDefaults = child('app', p.file, runs);
		const largestPhoto = p === photos.at(-1);
		const met = app.peakMiB < GOAL_MIB;
		if (largestPhoto && !met) missed = true;
		console.log(
			`${p.name}, ${(p.bytes.length / 1e6).toFixed(1)} MB: app median ${app.ms.toFixed(0)} ms, ` +
				`peak RSS ${app.peakMiB.toFixed(1)} MiB (idle ${app.idleMiB.toFixed(1)}; as the server starts, ` +
				`MALLOC_ARENA_MAX=${SERVER_ENV.MALLOC_ARENA_MAX}), with glibc's defaults ` +
				`${glibcDefaults.peakMiB.toFixed(1)} MiB; bare sharp ${baseline.ms.toFixed(0)} ms, ` +
				`peak ${baseline.peakMiB.toFixed(1)} MiB; time ratio ${(app.ms / baseline.ms).toFixed(2)}` +
				(largestPhoto ? `   goal: app peak < ${GOAL_MIB} MiB ${met ? 'met' : 'MISSED'}` : '') +
				`   (load average ${load()})`
		);
		results.push({
			photo: p.name,
			inputBytes: p.bytes.length,
			appMedianMs: app.ms,
			appPeakMiB: app.peakMiB,
			appIdleMiB: app.idleMiB,
			appPeakMiBWithGlibcDefaults: glibcDefaults.peakMiB,
			bareSharpMedianMs: baseline.ms,
			bareSharpPeakMiB: baseline.peakMiB,
			ratio: app.ms / baseline.ms
		});
	}
	console.log(`Written to ${writeResult('photos', { runs, goalMiB: GOAL_MIB, results })}`);
	if (missed) process.exitCode = 1;
} finally {
	rmSync(dir, { recursive: true, force: true });
}
