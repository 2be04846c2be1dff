// The photo pipeline for yard photos: the type comes from the bytes, never from the name or the
// declared type; decoding runs under a pixel limit and fails on truncated data; the camera's
// orientation is applied; every bit of metadata (GPS above all) is dropped; two sizes come out.
import { availableParallelism } from 'node:os';
import sharp from 'sharp';
import { PHOTO_LIMITS, cleanFileName } from '../../schema/intake';

export const PIXEL_LIMIT = 40_000_000;
export const DISPLAY_EDGE = 2048;
export const THUMB_EDGE = 480;

export type Sniffed = 'jpeg' | 'png' | 'webp' | 'heic' | 'avif' | 'gif' | 'svg' | 'unknown';

/** The image type from the first bytes of a file. */
export function sniff(bytes: Uint8Array): Sniffed {
	const at = (i: number, ...values: number[]) => values.every((v, k) => bytes[i + k] === v);
	const ascii = (i: number, s: string) => at(i, ...[...s].map((c) => c.charCodeAt(0)));
	if (at(0, 0xff, 0xd8, 0xff)) return 'jpeg';
	if (at(0, 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return 'png';
	if (ascii(0, 'RIFF') && ascii(8, 'WEBP')) return 'webp';
	if (ascii(0, 'GIF8')) return 'gif';
	if (ascii(4, 'ftyp')) {
		const brand = String.fromCharCode(...bytes.slice(8, 12));
		if (/^(avif|avis)$/.test(brand)) return 'avif';
		if (/^(heic|heix|hevc|hevx|heim|heis|mif1|msf1)$/.test(brand)) return 'heic';
	}
	const head = new TextDecoder().decode(bytes.slice(0, 512)).trimStart().toLowerCase();
	if (head.startsWith('<svg') || (head.startsWith('<?xml') && head.includes('<svg'))) return 'svg';
	return 'unknown';
}

export class PhotoError extends Error {
	constructor(
		readonly fileName: string,
		message: string
	) {
		super(message);
		this.name = 'PhotoError';
	}
}

export interface ProcessedPhoto {
	originalName: string;
	display: Buffer;
	thumb: Buffer;
	contentType: 'image/webp';
	width: number;
	height: number;
	bytes: number;
}

const MB = (n: number) => `${Math.round(n / (1024 * 1024))} MB`;

/** Refuses an empty or oversized file before its bytes are read. Throws PhotoError. */
export function checkPhotoSize(name: string, size: number): void {
	const shown = `“${cleanFileName(name)}”`;
	if (size === 0) throw new PhotoError(name, `${shown} is empty (0 bytes).`);
	if (size > PHOTO_LIMITS.maxBytes) {
		throw new PhotoError(
			name,
			`${shown} is ${MB(size)}; each photo can be at most ${MB(PHOTO_LIMITS.maxBytes)}.`
		);
	}
}

/** Checks what can be checked without decoding: emptiness, size and type. Throws PhotoError. */
export function checkPhotoBytes(name: string, bytes: Uint8Array): void {
	const shown = `“${cleanFileName(name)}”`;
	checkPhotoSize(name, bytes.byteLength);
	const type = sniff(bytes);
	if (type === 'heic' || type === 'avif') {
		throw new PhotoError(
			name,
			`${shown} is a HEIC/HEIF photo, which we cannot open. Phones can send JPEG instead: pick the photo through this form (iPhones convert it), or set the camera to “Most Compatible”.`
		);
	}
	if (type !== 'jpeg' && type !== 'png' && type !== 'webp') {
		throw new PhotoError(
			name,
			`${shown} is not a JPEG, PNG or WebP photo${type === 'svg' ? ' (it is an SVG drawing)' : ''}.`
		);
	}
}

// libvips keeps a cache of recent operations (up to 50 MB and 100 operations by default) to
// serve repeated work on the same image; every photo here is new, so the cache only holds
// memory. One libvips thread per photo: the app already decodes one photo per spare core at a
// time (below), and each extra thread brings its own buffers.
sharp.cache(false);
sharp.concurrency(1);

// Photos decoded at once in this process. libvips already uses every core for one photo; more at
// once only queue for the same cores and starve every other request (npm run bench:load saw the
// office API stall past 10 s under 50 simultaneous inquiries). The rest wait their turn.
const AT_ONCE = Math.max(1, availableParallelism() - 1);
let running = 0;
const waiting: (() => void)[] = [];

async function inTurn<T>(work: () => Promise<T>): Promise<T> {
	// A finishing photo hands its slot straight to the next one waiting.
	if (running >= AT_ONCE) await new Promise<void>((resolve) => waiting.push(resolve));
	else running++;
	try {
		return await work();
	} finally {
		const next = waiting.shift();
		if (next) next();
		else running--;
	}
}

/**
 * Turns an image as the EXIF orientation tag (1–8) says, as sharp's autoOrient does (checked
 * against it for every tag in src/lib/server/platform/images.spec.ts). sharp mirrors before it
 * rotates.
 */
function orient(image: sharp.Sharp, orientation: number | undefined): sharp.Sharp {
	switch (orientation) {
		case 2:
			return image.flop();
		case 3:
			return image.rotate(180);
		case 4:
			return image.flip();
		case 5:
			return image.flip().rotate(90);
		case 6:
			return image.rotate(90);
		case 7:
			return image.flop().rotate(90);
		case 8:
			return image.rotate(270);
		default:
			return image;
	}
}

/** Decodes, orients, strips and resizes one photo. Throws PhotoError with a message naming it. */
export function processPhoto(name: string, bytes: Uint8Array): Promise<ProcessedPhoto> {
	return inTurn(() => decodeAndResize(name, bytes));
}

async function decodeAndResize(name: string, bytes: Uint8Array): Promise<ProcessedPhoto> {
	checkPhotoBytes(name, bytes);
	const shown = `“${cleanFileName(name)}”`;
	const input = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let meta: sharp.Metadata;
	try {
		// Only the header is read here, so the pixel limit is checked by hand to name the size.
		meta = await sharp(input, { limitInputPixels: false }).metadata();
	} catch {
		throw new PhotoError(name, `${shown} could not be read as a photo; it may be damaged.`);
	}
	const w = meta.width ?? 0;
	const h = meta.height ?? 0;
	if (!w || !h) throw new PhotoError(name, `${shown} has no picture in it.`);
	if (w * h > PIXEL_LIMIT) {
		throw new PhotoError(
			name,
			`${shown} is ${w} × ${h} pixels; photos can be at most 40 megapixels.`
		);
	}
	try {
		// One decode, read in order (sequentialRead) and shrunk while decoding when the display copy
		// is at most half the photo's size (JPEG and WebP shrink-on-load): a 40-megapixel photo never
		// lies in memory at full size. The camera's orientation is applied after the resize, to the
		// small copy, since turning a photo needs all of it at once; the 2048-pixel box is square, so
		// the size comes out the same either way. sharp drops EXIF, GPS, XMP and ICC unless asked to
		// keep them. The thumbnail comes from the small display copy, not from the photo again.
		const small = await sharp(input, {
			limitInputPixels: PIXEL_LIMIT,
			failOn: 'truncated',
			sequentialRead: true
		})
			.resize(DISPLAY_EDGE, DISPLAY_EDGE, { fit: 'inside', withoutEnlargement: true })
			.raw()
			.toBuffer({ resolveWithObject: true });
		const { width, height, channels } = small.info;
		const display = await orient(
			sharp(small.data, { raw: { width, height, channels } }),
			meta.orientation
		)
			.webp({ quality: 82 })
			.toBuffer({ resolveWithObject: true });
		const thumb = await sharp(display.data, { sequentialRead: true })
			.resize(THUMB_EDGE, THUMB_EDGE, { fit: 'inside', withoutEnlargement: true })
			.webp({ quality: 74 })
			.toBuffer();
		return {
			originalName: cleanFileName(name),
			display: display.data,
			thumb,
			contentType: 'image/webp',
			width: display.info.width,
			height: display.info.height,
			bytes: bytes.byteLength
		};
	} catch {
		throw new PhotoError(
			name,
			`${shown} is damaged or incomplete (it may not have finished copying). Please send it again.`
		);
	}
}
