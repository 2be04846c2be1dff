// The inquiry intake: one server pipeline for the upload API (a photo at a time, as drafts) and
// the form action (everything in one multipart post when the browser runs no JavaScript).
// Photos are stored first; then every record is written in ONE transaction, with the two
// e-mails in the outbox; the mails are queued after the commit.
import { createHmac, timingSafeEqual } from 'node:crypto';
import { and, eq, gt, inArray, isNull, lt, sql } from 'drizzle-orm';
import {
	PHOTO_LIMITS,
	inquirySchema,
	inquiryValues,
	type InquiryInput,
	type InquiryValues
} from '$lib/schema/intake';
import { fieldErrors } from '$lib/schema/auth';
import { db, type Tx } from '../platform/db';
import { minutes, SharedRateLimiter } from '../platform/rate-limit';
import { activities, contacts, leads, photos, properties, users } from '../platform/db/schema';
import { newId, newToken } from '../platform/crypto';
import { env, origin, requireSecret } from '../platform/env';
import { PhotoError, checkPhotoSize, processPhoto, type ProcessedPhoto } from '../platform/images';
import { acknowledgment, ownerAlert } from './intake-mail';
import { isDatabaseUnavailable } from '../platform/outage';
import { dispatchMail, writeMail } from '../platform/outbox';
import { defineJob, enqueue, queue } from '../platform/queue';
import { firmSettings } from '../platform/settings';
import { StorageUnavailableError, deleteObjects, putObject, randomKey } from '../platform/storage';


/** Unclaimed drafts older than this are swept away. */
export const DRAFT_TTL_MS = 24 * 60 * 60 * 1000;

// ---------------------------------------------------------------------------------------------
// Photos: stored in S3, then recorded either as a draft or straight onto the lead

export interface StoredPhoto {
	displayKey: string;
	thumbKey: string;
	width: number;
	height: number;
	bytes: number;
	originalName: string;
}

export interface Draft {
	token: string;
	name: string;
}

export async function storePhoto(p: ProcessedPhoto): Promise<StoredPhoto> {
	const displayKey = randomKey('intake', 'display.webp');
	const thumbKey = randomKey('intake', 'thumb.webp');
	await putObject(displayKey, p.display, p.contentType);
	try {
		await putObject(thumbKey, p.thumb, p.contentType);
	} catch (error) {
		await discardKeys([displayKey]);
		throw error;
	}
	return {
		displayKey,
		thumbKey,
		width: p.width,
		height: p.height,
		bytes: p.bytes,
		originalName: p.originalName
	};
}

async function discardKeys(keys: string[]): Promise<void> {
	try {
		await deleteObjects(keys);
	} catch (error) {
		// Left for nobody to find: log it, the bucket's own lifecycle rules are the last line.
		console.error('[intake] could not delete stored photos', keys, (error as Error).message);
	}
}

export async function discardStored(stored: StoredPhoto[]): Promise<void> {
	await discardKeys(stored.flatMap((s) => [s.displayKey, s.thumbKey]));
}

async function saveDrafts(stored: StoredPhoto[]): Promise<Draft[]> {
	const rows = stored.map((s) => ({
		id: newId(),
		draftToken: newToken(),
		context: 'intake',
		...s
	}));
	if (!rows.length) return [];
	await db.insert(photos).values(rows);
	void ensureSweepScheduled();
	return rows.map((r) => ({ token: r.draftToken, name: r.originalName }));
}

export type UploadResult =
	| { ok: true; draft: Draft & { width: number; height: number } }
	| { ok: false; status: number; message: string };

/** The upload API: one photo, processed and stored as a draft the form refers to later. */
export async function uploadDraft(file: File | null): Promise<UploadResult> {
	if (!file || typeof file === 'string') {
		return { ok: false, status: 400, message: 'Send one photo in the field “file”.' };
	}
	let processed: ProcessedPhoto;
	try {
		checkPhotoSize(file.name, file.size);
		processed = await processPhoto(file.name, new Uint8Array(await file.arrayBuffer()));
	} catch (error) {
		if (error instanceof PhotoError) {
			return { ok: false, status: statusOf(error), message: error.message };
		}
		throw error;
	}
	let stored: StoredPhoto;
	try {
		stored = await storePhoto(processed);
	} catch (error) {
		if (error instanceof StorageUnavailableError) {
			return { ok: false, status: 503, message: STORAGE_DOWN };
		}
		throw error;
	}
	try {
		const [draft] = await saveDrafts([stored]);
		return { ok: true, draft: { ...draft, width: stored.width, height: stored.height } };
	} catch (error) {
		await discardStored([stored]);
		if (isDatabaseUnavailable(error)) return { ok: false, status: 503, message: DATABASE_DOWN };
		throw error;
	}
}

/** Removes a draft its uploader no longer wants (only the uploader knows the token). */
export async function deleteDraft(token: string): Promise<boolean> {
	const [row] = await db
		.delete(photos)
		.where(and(eq(photos.draftToken, token), isNull(photos.leadId)))
		.returning();
	if (!row) return false;
	await discardKeys([row.displayKey, row.thumbKey]);
	return true;
}

function statusOf(error: PhotoError): number {
	if (/at most \d+ MB|megapixels/.test(error.message)) return 413;
	if (/not a JPEG|HEIC/.test(error.message)) return 415;
	return 422;
}

// ---------------------------------------------------------------------------------------------
// Abuse limits that need no state: a honeypot and a signed "form opened at" stamp

export const HONEYPOT = 'website';

function secret(): string {
	return requireSecret('FORM_SECRET');
}

const sign = (value: string) => createHmac('sha256', secret()).update(value).digest('base64url');

/** A stamp of when the form was shown, signed so a bot cannot make up an earlier time. */
export function formStamp(now = Date.now()): string {
	const value = String(now);
	return `${value}.${sign(value)}`;
}

export function minFillMs(): number {
	return Number(env.INTAKE_MIN_FILL_SECONDS ?? 3) * 1000;
}

/** Null when the stamp is genuine and old enough, else the reason to refuse. */
export function checkStamp(stamp: string, now = Date.now()): string | null {
	const [value, mac] = stamp.split('.');
	const expected = value ? sign(value) : '';
	const ok =
		mac &&
		mac.length === expected.length &&
		timingSafeEqual(Buffer.from(mac), Buffer.from(expected));
	const at = Number(value);
	if (!ok || !Number.isFinite(at)) {
		return 'This form has expired. Please check it and send it again.';
	}
	if (now - at < minFillMs()) {
		return 'That was very quick. Please check your details and send the form again.';
	}
	if (now - at > 7 * DRAFT_TTL_MS) {
		return 'This form was open for a long time. Please send it again.';
	}
	return null;
}

/** The signed thank-you link: the page shows the number only when the link is genuine. */
export function thanksPath(number: number): string {
	return `/start/thanks?n=${number}&s=${sign(`thanks:${number}`).slice(0, 16)}`;
}
export function verifyThanks(n: string | null, s: string | null): number | null {
	if (!n || !s || !/^\d{1,9}$/.test(n)) return null;
	return sign(`thanks:${n}`).slice(0, 16) === s ? Number(n) : null;
}

// ---------------------------------------------------------------------------------------------
// The records

export class IntakeError extends Error {
	constructor(
		readonly field: string,
		message: string,
		readonly status = 400
	) {
		super(message);
	}
}

export const STORAGE_DOWN =
	'Our photo storage is out of reach for a moment, so nothing was sent. Everything you typed is still here: please try again in a minute.';
export const DATABASE_DOWN =
	'Our records are out of reach for a moment, so nothing was sent. Everything you typed is still here: please try again in a minute.';

const digits = (phone: string) => phone.replace(/\D/g, '');

/**
 * The contact of an inquiry: the one with the same e-mail address, or a new one. A shared phone
 * number or name never joins two inquiries (a household, a typo or a stranger would then get
 * someone else's estimate mails); the office sees such pairs as possible duplicates and merges
 * them by hand (contact-merge.ts). What the inquiry typed is kept on its timeline entry.
 */
async function findOrCreateContact(tx: Tx, input: InquiryInput): Promise<string> {
	const email = input.email.toLowerCase();
	const phone = digits(input.phone);
	const [found] = await tx.select().from(contacts).where(eq(contacts.email, email)).limit(1);
	if (found) {
		if (!found.phone && input.phone) {
			await tx
				.update(contacts)
				.set({ phone: input.phone, phoneDigits: phone || null })
				.where(eq(contacts.id, found.id));
		}
		return found.id;
	}
	const id = newId();
	const inserted = await tx
		.insert(contacts)
		.values({ id, name: input.name, email, phone: input.phone || null, phoneDigits: phone || null })
		.onConflictDoNothing({ target: contacts.email })
		.returning({ id: contacts.id });
	if (inserted[0]) return inserted[0].id;
	// Another inquiry with this e-mail committed a moment ago.
	const [again] = await tx.select().from(contacts).where(eq(contacts.email, email)).limit(1);
	return again.id;
}

async function findOrCreateProperty(tx: Tx, contactId: string, input: InquiryInput) {
	const [existing] = await tx
		.select({ id: properties.id })
		.from(properties)
		.where(
			and(
				eq(properties.contactId, contactId),
				sql`lower(${properties.street}) = lower(${input.street})`,
				sql`lower(${properties.town}) = lower(${input.town})`
			)
		)
		.limit(1);
	if (existing) return existing.id;
	const id = newId();
	await tx.insert(properties).values({
		id,
		contactId,
		street: input.street,
		town: input.town,
		postalCode: input.postalCode
	});
	return id;
}

export interface Submission {
	input: InquiryInput;
	draftTokens: string[];
	newPhotos: StoredPhoto[];
	projectTitle?: string;
	source?: string;
}

/** Writes the contact, property, lead, photos, first timeline entry and both e-mails at once. */
export async function submitInquiry(sub: Submission): Promise<{ leadId: string; number: number }> {
	const firm = await firmSettings();
	const { input } = sub;
	const result = await db.transaction(async (tx) => {
		const contactId = await findOrCreateContact(tx, input);
		const propertyId = await findOrCreateProperty(tx, contactId, input);
		const leadId = newId();
		const [lead] = await tx
			.insert(leads)
			.values({
				id: leadId,
				contactId,
				propertyId,
				stage: 'new',
				services: input.services,
				budget: input.budget,
				timeframe: input.timeframe,
				heardFrom: input.heardFrom,
				message: input.message,
				source: sub.source ?? 'website',
				referenceProject: input.ref || null,
				consentAt: new Date()
			})
			.returning({ number: leads.number });

		const tokens = [...new Set(sub.draftTokens)];
		const since = new Date(Date.now() - DRAFT_TTL_MS);
		const claimed = tokens.length
			? await tx
					.update(photos)
					.set({ leadId, draftToken: null })
					.where(
						and(
							inArray(photos.draftToken, tokens),
							isNull(photos.leadId),
							gt(photos.createdAt, since)
						)
					)
					.returning({ bytes: photos.bytes })
			: [];
		if (claimed.length < tokens.length) {
			const lost = tokens.length - claimed.length;
			throw new IntakeError(
				'photos',
				`${lost === 1 ? 'One photo' : `${lost} photos`} you added earlier ${lost === 1 ? 'has' : 'have'} expired. Please add ${lost === 1 ? 'it' : 'them'} again.`,
				409
			);
		}
		const count = claimed.length + sub.newPhotos.length;
		const total = [...claimed, ...sub.newPhotos].reduce((n, p) => n + p.bytes, 0);
		if (count > PHOTO_LIMITS.maxFiles) {
			throw new IntakeError('photos', `Send at most ${PHOTO_LIMITS.maxFiles} photos.`, 413);
		}
		if (total > PHOTO_LIMITS.maxTotalBytes) {
			throw new IntakeError('photos', 'The photos come to more than 60 MB in all.', 413);
		}
		if (sub.newPhotos.length) {
			await tx
				.insert(photos)
				.values(sub.newPhotos.map((p) => ({ id: newId(), leadId, context: 'intake', ...p })));
		}
		await tx.insert(activities).values({
			leadId,
			kind: 'inquiry',
			body: input.message,
			data: {
				services: input.services,
				budget: input.budget,
				timeframe: input.timeframe,
				photos: count,
				ref: input.ref || null,
				source: sub.source ?? 'website',
				typed: { name: input.name, email: input.email, phone: input.phone }
			}
		});

		const summary = {
			number: lead.number,
			leadId,
			input,
			photoCount: count,
			projectTitle: sub.projectTitle
		};
		const ack = acknowledgment(firm, summary);
		const mailIds: (string | null)[] = [
			await writeMail({ dedupeKey: `inquiry-ack:${leadId}`, to: input.email, leadId, ...ack }, tx)
		];
		const owners = await tx
			.select({ id: users.id, email: users.email })
			.from(users)
			.where(and(eq(users.role, 'owner'), isNull(users.disabledAt)));
		const alert = ownerAlert(firm, summary, `${origin()}/office/leads/${leadId}`);
		const recipients = owners.length ? owners : [{ id: 'firm', email: firm.email }];
		for (const owner of recipients) {
			mailIds.push(
				await writeMail(
					{ dedupeKey: `lead-alert:${leadId}:${owner.id}`, to: owner.email, leadId, ...alert },
					tx
				)
			);
		}
		return { leadId, number: lead.number, mailIds };
	});
	for (const id of result.mailIds) {
		if (!id) continue;
		// The message is safe in the outbox; a queue hiccup here only delays it (logged).
		await dispatchMail(id).catch((error) =>
			console.error('[intake] could not queue mail', id, (error as Error).message)
		);
	}
	return { leadId: result.leadId, number: result.number };
}

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
		for (const p of processed) stored.push(await storePhoto(p));
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

// ---------------------------------------------------------------------------------------------
// The sweep of drafts never claimed by an inquiry

export const SWEEP_JOB = 'intake.sweep-drafts';

/** Deletes unclaimed draft photos older than the cut-off from S3 and the table. Idempotent. */
export async function sweepDrafts(
	olderThan = new Date(Date.now() - DRAFT_TTL_MS)
): Promise<number> {
	let removed = 0;
	for (;;) {
		const batch = await db
			.select({ id: photos.id, displayKey: photos.displayKey, thumbKey: photos.thumbKey })
			.from(photos)
			.where(and(isNull(photos.leadId), lt(photos.createdAt, olderThan)))
			.limit(200);
		if (!batch.length) return removed;
		await deleteObjects(batch.flatMap((p) => [p.displayKey, p.thumbKey]));
		await db.delete(photos).where(
			and(
				inArray(
					photos.id,
					batch.map((p) => p.id)
				),
				isNull(photos.leadId)
			)
		);
		removed += batch.length;
	}
}

defineJob(SWEEP_JOB, async () => {
	await sweepDrafts();
});

let scheduled: Promise<void> | null = null;

/** Registers the hourly sweep with pg-boss once per process (the schedule itself is shared). */
export function ensureSweepScheduled(): Promise<void> {
	scheduled ??= (async () => {
		const q = await queue();
		await q.createQueue(SWEEP_JOB);
		await q.schedule(SWEEP_JOB, '17 * * * *', {}, { tz: 'UTC' });
	})().catch((error) => {
		scheduled = null;
		console.error('[intake] sweep not scheduled yet:', (error as Error).message);
	});
	return scheduled;
}

/** Runs a sweep now through the queue (used by the seed and by tests). */
export async function enqueueSweep(): Promise<void> {
	await enqueue(SWEEP_JOB, {});
}

// ---------------------------------------------------------------------------------------------
// Per-address rate limits, counted in PostgreSQL so that every app process shares them.
// Numbers: common practice, no source.

export const inquiryLimiter = new SharedRateLimiter('inquiry', [
	{ hits: 10, windowMs: minutes(15) },
	{ hits: 40, windowMs: minutes(24 * 60) }
]);
export const uploadLimiter = new SharedRateLimiter('upload', [{ hits: 60, windowMs: minutes(15) }]);
