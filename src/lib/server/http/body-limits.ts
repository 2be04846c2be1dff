// How many bytes each route may receive in one request, whatever the framing: a declared
// Content-Length over the limit is refused before a byte is read, and a chunked body is counted
// as it streams and refused the moment it passes the limit (hooks/body.ts).
import { MB, PHOTO_LIMITS } from '$lib/schema/intake';

/** Room for the multipart boundaries and the other fields of a form beside its files. */
const FORM_OVERHEAD = 256 * 1024;

export interface BodyLimit {
	/** What the limit is for (documentation and tests). */
	name: string;
	matches: (pathname: string) => boolean;
	bytes: number;
	message: string;
}

const PHOTO_MESSAGE = `Each photo can be at most ${PHOTO_LIMITS.maxBytes / MB} MB.`;

export const BODY_LIMITS: readonly BodyLimit[] = [
	{
		name: 'one photo (inquiry uploads)',
		matches: (p) => p === '/api/uploads',
		bytes: PHOTO_LIMITS.maxBytes + FORM_OVERHEAD,
		message: PHOTO_MESSAGE
	},
	{
		name: 'a whole inquiry with its photos',
		matches: (p) => p === '/start',
		bytes: PHOTO_LIMITS.maxTotalBytes + FORM_OVERHEAD,
		message: `The photos of one inquiry can be at most ${PHOTO_LIMITS.maxTotalBytes / MB} MB in all. Send fewer or smaller photos.`
	},
	{
		name: 'a problem report with its photos (warranty callbacks)',
		matches: (p) => /^\/callback\/[^/]+$/.test(p),
		bytes: 4 * PHOTO_LIMITS.maxBytes + FORM_OVERHEAD,
		message: `The photos of one report can be at most ${(4 * PHOTO_LIMITS.maxBytes) / MB} MB in all.`
	},
	{
		name: 'a visit or job photo',
		matches: (p) => /^\/office\/(visits|jobs)\/[^/]+$/.test(p),
		bytes: PHOTO_LIMITS.maxBytes + FORM_OVERHEAD,
		message: PHOTO_MESSAGE
	},
	{
		name: 'a price list import',
		matches: (p) => p === '/office/price-list/import',
		bytes: 5 * MB,
		message: 'The price list file can be at most 5 MB.'
	}
];

export const DEFAULT_BODY_LIMIT: BodyLimit = {
	name: 'any other request',
	matches: () => true,
	bytes: 1 * MB,
	message: 'This request is too large: at most 1 MB can be sent here.'
};

export function bodyLimitFor(pathname: string): BodyLimit {
	return BODY_LIMITS.find((l) => l.matches(pathname)) ?? DEFAULT_BODY_LIMIT;
}

/** Bodies up to this size are held in memory while counted; larger ones go to a temp file. */
export const SPOOL_ABOVE = 1 * MB;
