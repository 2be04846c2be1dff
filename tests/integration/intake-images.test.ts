// The photo pipeline on its own: types from bytes, limits, orientation, metadata.
import sharp from 'sharp';
import { describe, expect, it, vi } from 'vitest';
import { PIXEL_LIMIT, PhotoError, processPhoto, sniff } from '$lib/server/platform/images';
import { cleanFileName } from '$lib/schema/intake';
import {
	heic,
	png,
	pngBomb,
	sidewaysGpsJpeg,
	svgWithScript,
	textNamedJpg,
	truncatedJpeg,
	webp,
	yardJpeg
} from '../fixtures/images/make';

// A pass-through wrapper on sharp (a dependency, not the module under test) that records the
// options of each image opened, so a test can tell a header read from a decode under the limit.
const sharpOpened = vi.hoisted(() => ({ options: [] as unknown[] }));
vi.mock('sharp', async (importOriginal) => {
	const actual = (await importOriginal<{ default: typeof import('sharp') }>()).default;
	const wrapped = (...args: Parameters<typeof actual>) => {
		sharpOpened.options.push(args[1]);
		return actual(...args);
	};
	return { default: Object.assign(wrapped, actual) };
});

async function refusal(name: string, bytes: Buffer): Promise<PhotoError> {
	const error = await processPhoto(name, bytes).then(
		() => null,
		(e: unknown) => e
	);
	expect(error).toBeInstanceOf(PhotoError);
	return error as PhotoError;
}

describe('the photo pipeline', () => {
	it('sniffs the type from the bytes, not the name', async () => {
		expect(sniff(await yardJpeg())).toBe('jpeg');
		expect(sniff(await png())).toBe('png');
		expect(sniff(await webp())).toBe('webp');
		expect(sniff(heic())).toBe('heic');
		expect(sniff(svgWithScript)).toBe('svg');
		expect(sniff(textNamedJpg)).toBe('unknown');
	});

	it('makes a 2048 px display copy and a 480 px thumbnail in WebP', async () => {
		const out = await processPhoto('yard.jpg', await yardJpeg(4000, 3000));
		expect(out.width).toBe(2048);
		expect(out.height).toBe(1536);
		const thumb = await sharp(out.thumb).metadata();
		expect([thumb.format, thumb.width, thumb.height]).toEqual(['webp', 480, 360]);
		expect((await sharp(out.display).metadata()).format).toBe('webp');
	});

	it('never enlarges a small photo', async () => {
		const out = await processPhoto('small.png', await png(300, 200));
		expect([out.width, out.height]).toEqual([300, 200]);
	});

	it('stands a sideways photo upright and drops its GPS and camera data', async () => {
		const input = await sidewaysGpsJpeg();
		const before = await sharp(input).metadata();
		expect(before.orientation).toBe(6);
		expect(before.exif?.length).toBeGreaterThan(0);
		expect(before.exif!.toString('latin1')).toContain('TestCam');

		const out = await processPhoto('IMG_0001.jpg', input);
		for (const copy of [out.display, out.thumb]) {
			const meta = await sharp(copy).metadata();
			expect(meta.exif).toBeUndefined();
			expect(meta.xmp).toBeUndefined();
			expect(meta.icc).toBeUndefined();
			expect(meta.orientation).toBeUndefined();
			expect(meta.height!).toBeGreaterThan(meta.width!); // upright: portrait
			expect(copy.toString('latin1')).not.toContain('TestCam');
		}
		expect([out.width, out.height]).toEqual([400, 600]);
		// Orientation 6 turns the stored image 90° clockwise: its red left half ends up on top.
		const { data } = await sharp(out.display).raw().toBuffer({ resolveWithObject: true });
		const [r, g, b] = [data[0], data[1], data[2]];
		expect(r).toBeGreaterThan(150);
		expect(b).toBeLessThan(100);
		expect(g).toBeLessThan(100);
	});

	it('refuses the bad-input corpus with a message that names the file', async () => {
		const cases: [string, Buffer, RegExp][] = [
			['empty.jpg', Buffer.alloc(0), /“empty\.jpg” is empty/],
			['half.jpg', await truncatedJpeg(), /“half\.jpg” is damaged or incomplete/],
			['notes.jpg', textNamedJpg, /“notes\.jpg” is not a JPEG, PNG or WebP photo/],
			['drawing.svg', svgWithScript, /“drawing\.svg” is not a JPEG.*SVG drawing/],
			['bomb.png', pngBomb(), /“bomb\.png” is 20000 × 20000 pixels; .*40 megapixels/],
			['IMG_1234.HEIC', heic(), /“IMG_1234\.HEIC” is a HEIC.*Phones can send JPEG/]
		];
		for (const [name, bytes, message] of cases) {
			const error = await refusal(name, bytes);
			expect(error.message, name).toMatch(message);
		}
	});

	it('keeps the pixel bomb small on the wire and refuses it before decoding', async () => {
		// The memory a decode would take is measured by `npm run bench:photos`, not asserted here.
		const bomb = pngBomb();
		expect(bomb.length).toBeLessThan(100 * 1024);
		sharpOpened.options.length = 0;
		const error = await refusal('bomb.png', bomb);
		// The refusal names the size read from the header, not sharp's own pixel-limit failure.
		expect(error.message).toBe(
			'“bomb.png” is 20000 × 20000 pixels; photos can be at most 40 megapixels.'
		);
		// Only the header was opened (no pixel limit, metadata only); the decode, which opens the
		// image under the 40 MP limit, never started.
		expect(sharpOpened.options).toEqual([{ limitInputPixels: false }]);
		expect(sharpOpened.options).not.toContainEqual(
			expect.objectContaining({ limitInputPixels: PIXEL_LIMIT })
		);
	});

	it('opens an accepted photo for decoding under the 40 MP limit', async () => {
		sharpOpened.options.length = 0;
		await processPhoto('small.png', await png(300, 200));
		expect(sharpOpened.options).toContainEqual(
			expect.objectContaining({ limitInputPixels: PIXEL_LIMIT, failOn: 'truncated' })
		);
	});

	it('keeps a file name only as harmless text', () => {
		expect(cleanFileName('../../etc/passwd.jpg')).toBe('passwd.jpg');
		expect(cleanFileName('C:\\Users\\me\\yard.jpg')).toBe('yard.jpg');
		expect(cleanFileName('...')).toBe('photo');
		expect(cleanFileName('\u202Egpj.exe')).toBe('gpj.exe');
		expect(cleanFileName('Gartenteich – Süd 🌿.jpg')).toBe('Gartenteich – Süd 🌿.jpg');
		expect(cleanFileName('a\u0000b\nc.jpg')).toBe('abc.jpg');
		expect(cleanFileName('x'.repeat(300))).toHaveLength(120);
	});
});
