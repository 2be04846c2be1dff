// The photo pipeline turns photos itself (after shrinking them, to save memory), so its turns are
// checked against sharp's own autoOrient for every EXIF orientation tag.
import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { processPhoto } from './images';

// 120 × 80 in four colours, one per quarter, so every turn and mirror shows.
const QUARTERS = [
	[220, 30, 30],
	[30, 200, 30],
	[30, 30, 220],
	[230, 230, 40]
];
async function quartered(orientation: number): Promise<Buffer> {
	const w = 120;
	const h = 80;
	const raw = Buffer.alloc(w * h * 3);
	for (let y = 0; y < h; y++) {
		for (let x = 0; x < w; x++) {
			const q = (y < h / 2 ? 0 : 2) + (x < w / 2 ? 0 : 1);
			raw.set(QUARTERS[q], (y * w + x) * 3);
		}
	}
	return sharp(raw, { raw: { width: w, height: h, channels: 3 } })
		.png()
		.withMetadata({ orientation })
		.toBuffer();
}

/** The colour at the middle of each quarter of an image. */
async function quarterColours(image: Buffer): Promise<number[][]> {
	const { data, info } = await sharp(image)
		.removeAlpha()
		.raw()
		.toBuffer({ resolveWithObject: true });
	return [
		[0.25, 0.25],
		[0.75, 0.25],
		[0.25, 0.75],
		[0.75, 0.75]
	].map(([fx, fy]) => {
		const at = (Math.floor(fy * info.height) * info.width + Math.floor(fx * info.width)) * 3;
		return [data[at], data[at + 1], data[at + 2]];
	});
}

describe('photo orientation', () => {
	it.each([1, 2, 3, 4, 5, 6, 7, 8])(
		'turns a photo tagged %i as sharp autoOrient does',
		async (tag) => {
			const input = await quartered(tag);
			const expected = await sharp(input).autoOrient().png().toBuffer();
			const out = await processPhoto('tagged.png', input);
			const [want, got] = [await sharp(expected).metadata(), await sharp(out.display).metadata()];
			expect([got.width, got.height]).toEqual([want.width, want.height]);
			const wantColours = await quarterColours(expected);
			const gotColours = await quarterColours(out.display);
			for (let q = 0; q < 4; q++) {
				for (let c = 0; c < 3; c++) {
					expect(Math.abs(gotColours[q][c] - wantColours[q][c]), `quarter ${q}`).toBeLessThan(30);
				}
			}
		}
	);
});
