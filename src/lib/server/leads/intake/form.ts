// The inquiry form post, with or without JavaScript (without it, the photos come in the same
// multipart post; with it, they were uploaded as drafts and the form posts their tokens).
import { and, inArray, isNull } from 'drizzle-orm';
import { PHOTO_LIMITS, inquirySchema, inquiryValues, type InquiryValues } from '$lib/schema/intake';
import { fieldErrors } from '$lib/schema/auth';
import { db } from '../../platform/db';
import { photos } from '../../platform/db/schema';
import {
	PhotoError,
	checkPhotoSize,
	processPhoto,
	type ProcessedPhoto
} from '../../platform/images';
import { isDatabaseUnavailable } from '../../platform/outage';
import { StorageUnavailableError } from '../../platform/storage';
import { discardStored, storePhoto, type StoredPhoto } from '../../photos/store';
import { type Draft, saveDrafts, statusOf } from './drafts';
import { IntakeError, STORAGE_DOWN, DATABASE_DOWN } from './errors';
import { HONEYPOT, checkStamp } from './stamp';
import { submitInquiry } from './records';

// ---------------------------------------------------------------------------------------------
// The form post, with or without JavaScript

export type InquiryResult =
	| { ok: true; leadId: string; number: number }
	| {
			ok: false;
			status: number;
			message: string;
			errors: Record<string, string>;
			values: InquiryValues;
			drafts: Draft[];
	  };

function filesOf(data: FormData): File[] {
	return data
		.getAll('photos')
		.filter((f): f is File => typeof f !== 'string')
		.filter((f) => !(f.size === 0 && f.name === ''));
}

function tokensOf(data: FormData): string[] {
	return data
		.getAll('photoToken')
		.filter((t): t is string => typeof t === 'string' && /^[A-Za-z0-9_-]{16,64}$/.test(t));
}

async function draftsFor(tokens: string[]): Promise<Draft[]> {
	if (!tokens.length) return [];
	try {
		const rows = await db
			.select({ token: photos.draftToken, name: photos.originalName })
			.from(photos)
			.where(and(inArray(photos.draftToken, tokens), isNull(photos.leadId)));
		return rows.map((r) => ({ token: r.token!, name: r.name }));
	} catch {
		return tokens.map((token) => ({ token, name: 'photo' }));
	}
}

export interface ReceiveOptions {
	/** Whether a `ref` names a portfolio project; returns its title when it does. */
	projectTitle?: (slug: string) => string | undefined;
	now?: number;
}

export async function receiveInquiry(
	data: FormData,
	options: ReceiveOptions = {}
): Promise<InquiryResult> {
	const values = inquiryValues(data);
	const tokens = [...new Set(tokensOf(data))];
	const files = filesOf(data);
	const fail = async (
		status: number,
		message: string,
		errors: Record<string, string> = {},
		kept?: Draft[]
	) => ({
		ok: false as const,
		status,
		message,
		errors,
		values,
		drafts: kept ?? (await draftsFor(tokens))
	});

	const honey = data.get(HONEYPOT);
	if (typeof honey === 'string' && honey.trim() !== '') {
		return fail(400, 'This form could not be sent. If you are a person, please call or e-mail us.');
	}
	const stampProblem = checkStamp(String(data.get('startedAt') ?? ''), options.now);
	if (stampProblem) return fail(400, stampProblem);

	// Limits that need no decoding first, so a huge post is refused cheaply.
	if (tokens.length + files.length > PHOTO_LIMITS.maxFiles) {
		return fail(413, 'Please fix the photos.', {
			photos: `Send at most ${PHOTO_LIMITS.maxFiles} photos; this has ${tokens.length + files.length}.`
		});
	}
	const total = files.reduce((n, f) => n + f.size, 0);
	if (total > PHOTO_LIMITS.maxTotalBytes) {
		return fail(413, 'Please fix the photos.', {
			photos: `These photos come to ${Math.round(total / 1024 / 1024)} MB; send at most 60 MB in all (fewer photos, or smaller ones).`
		});
	}

	const parsed = inquirySchema.safeParse(values);
	const errors: Record<string, string> = parsed.success ? {} : fieldErrors(parsed.error);
	let projectTitle: string | undefined;
	if (parsed.success && parsed.data.ref) {
		projectTitle = options.projectTitle?.(parsed.data.ref);
		if (!projectTitle) errors.ref = 'That project is not in our portfolio any more; remove it.';
	}

	// Decode every new photo before anything is stored: one bad photo stores nothing.
	const processed: ProcessedPhoto[] = [];
	const photoErrors: string[] = [];
	let photoStatus = 400;
	for (const file of files) {
		try {
			checkPhotoSize(file.name, file.size);
			processed.push(await processPhoto(file.name, new Uint8Array(await file.arrayBuffer())));
		} catch (error) {
			if (!(error instanceof PhotoError)) throw error;
			if (!photoErrors.length) photoStatus = statusOf(error);
			photoErrors.push(error.message);
		}
	}
	if (photoErrors.length) {
		errors.photos = photoErrors.join(' ');
		return fail(photoStatus, 'Please fix the photos (nothing was sent yet).', errors);
	}

	let stored: StoredPhoto[] = [];
	try {
		for (const p of processed) stored.push(await storePhoto(p, 'intake'));
	} catch (error) {
		await discardStored(stored);
		if (error instanceof StorageUnavailableError) return fail(503, STORAGE_DOWN, errors);
		throw error;
	}

	if (!parsed.success || Object.keys(errors).length) {
		// Keep the photos as drafts so the sender need not pick them again.
		try {
			const kept = await saveDrafts(stored);
			stored = [];
			return fail(400, 'Please check the fields marked below.', errors, [
				...(await draftsFor(tokens)),
				...kept
			]);
		} catch (error) {
			await discardStored(stored);
			if (isDatabaseUnavailable(error)) return fail(503, DATABASE_DOWN, errors, []);
			throw error;
		}
	}

	try {
		const done = await submitInquiry({
			input: parsed.data,
			draftTokens: tokens,
			newPhotos: stored,
			projectTitle
		});
		return { ok: true, ...done };
	} catch (error) {
		await discardStored(stored);
		if (error instanceof IntakeError) {
			return fail(error.status, 'Please fix the photos.', { [error.field]: error.message });
		}
		if (isDatabaseUnavailable(error)) return fail(503, DATABASE_DOWN, {}, []);
		throw error;
	}
}
