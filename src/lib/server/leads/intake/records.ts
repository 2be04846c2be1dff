// The inquiry's records: contact, property, lead, photos and the two e-mails, written in ONE
// transaction; the mails are queued after the commit.
import { and, eq, gt, inArray, isNull, sql } from 'drizzle-orm';
import { PHOTO_LIMITS, type InquiryInput } from '$lib/schema/intake';
import { db, type Tx } from '../../platform/db';
import { activities, contacts, leads, photos, properties, users } from '../../platform/db/schema';
import { newId } from '../../platform/crypto';
import { origin } from '../../platform/env';
import { acknowledgment, ownerAlert } from './mail';
import { dispatchMail, writeMail } from '../../platform/outbox';

import { firmSettings } from '../../platform/settings';
import { DRAFT_TTL_MS } from './drafts';
import type { StoredPhoto } from '../../photos/store';
import { IntakeError } from './errors';

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

/** The contact's property at this street and town (case aside), made when it is new. */
export async function findOrCreateProperty(
	tx: Tx,
	contactId: string,
	input: Pick<InquiryInput, 'street' | 'town' | 'postalCode'>
): Promise<string> {
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
