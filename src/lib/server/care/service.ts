// A service visit on the crew lead's phone and after it: the checklist of its kind, notes,
// photos, parts from the price list (added to the visit's invoice at list price), "done" with
// a short report to the homeowner (photos attached, a pay link where the plan bills per visit),
// the visit's invoice, and the homeowner's request for another day.
import { and, asc, eq, gte, lte, ne, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	contacts,
	priceListItems,
	properties,
	propertyFeatures,
	serviceVisitParts,
	serviceVisits,
	type ServiceVisit
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { firmOn } from '../payments/mail';
import { CURRENCY, dispatchAll } from '../payments/ledger';
import { createCheckout, paymentsClient } from '../payments/provider';
import { careCheckouts } from '../platform/db/schema';
import type { SessionUser } from '../auth/sessions';
import { VISIT_LABELS, type VisitKind } from '$lib/care/kinds';
import { CareError } from './db';
import { addressOf } from './features';
import { careLink, newCareLink } from './links';
import { build, dayText } from './mail';
import { serviceVisitPhotoAttachments } from './photos';
import { formatCents } from '$lib/money';

/** The visit, if this person may work on it: crew only on their own days. */
export async function serviceVisitFor(user: SessionUser, id: string): Promise<ServiceVisit> {
	const [v] = await db.select().from(serviceVisits).where(eq(serviceVisits.id, id));
	if (!v) throw new CareError('not_found', 'There is no such service visit.');
	if (user.role === 'crew' && v.crewLeadId !== user.id) {
		throw new CareError('forbidden', 'This visit is on another crew lead’s day.');
	}
	return v;
}

async function partsOf(visitId: string) {
	return db
		.select()
		.from(serviceVisitParts)
		.where(eq(serviceVisitParts.serviceVisitId, visitId))
		.orderBy(asc(serviceVisitParts.createdAt));
}

/** What the crew lead's phone shows: the place, the feature, the checklist; never a price. */
export async function crewServiceView(v: ServiceVisit) {
	const [row] = await db
		.select({ property: properties, contact: contacts, feature: propertyFeatures })
		.from(serviceVisits)
		.innerJoin(properties, eq(properties.id, serviceVisits.propertyId))
		.innerJoin(contacts, eq(contacts.id, properties.contactId))
		.innerJoin(propertyFeatures, eq(propertyFeatures.id, serviceVisits.featureId))
		.where(eq(serviceVisits.id, v.id));
	const parts = await partsOf(v.id);
	return {
		id: v.id,
		kind: v.kind,
		label: VISIT_LABELS[v.kind as VisitKind] ?? v.kind,
		status: v.status,
		day: v.day,
		homeowner: { name: row.contact.name, phone: row.contact.phone },
		address: addressOf(row.property),
		siteNotes: row.property.siteNotes,
		feature: {
			kind: row.feature.kind,
			size: row.feature.size,
			pump: row.feature.pump,
			lights: row.feature.lights,
			notes: row.feature.notes
		},
		checklist: v.checklist,
		notes: v.notes,
		parts: parts.map((p) => ({ id: p.id, name: p.name, unit: p.unit, quantity: p.quantity }))
	};
}

/** Price-list items a crew lead can add (names and units only). */
export async function partChoices() {
	return db
		.select({ sku: priceListItems.sku, name: priceListItems.name, unit: priceListItems.unit })
		.from(priceListItems)
		.where(eq(priceListItems.active, true))
		.orderBy(asc(priceListItems.category), asc(priceListItems.name));
}

function open(v: ServiceVisit) {
	if (v.status === 'done') throw new CareError('invalid', 'This visit is done.');
	if (v.status === 'cancelled') throw new CareError('invalid', 'This visit is cancelled.');
}

export async function tickChecklist(user: SessionUser, id: string, index: number, done: boolean) {
	const v = await serviceVisitFor(user, id);
	open(v);
	if (!v.checklist[index]) throw new CareError('invalid', 'There is no such checklist item.');
	const checklist = v.checklist.map((c, i) => (i === index ? { ...c, done } : c));
	await db.update(serviceVisits).set({ checklist }).where(eq(serviceVisits.id, id));
}

export async function saveServiceNotes(user: SessionUser, id: string, notes: string) {
	const v = await serviceVisitFor(user, id);
	open(v);
	await db.update(serviceVisits).set({ notes }).where(eq(serviceVisits.id, id));
}

export async function addPart(user: SessionUser, id: string, sku: string, quantity: number) {
	const v = await serviceVisitFor(user, id);
	open(v);
	const [item] = await db
		.select()
		.from(priceListItems)
		.where(and(eq(priceListItems.sku, sku), eq(priceListItems.active, true)));
	if (!item) throw new CareError('invalid', 'Pick a part from the price list.');
	await db.insert(serviceVisitParts).values({
		id: newId(),
		serviceVisitId: id,
		sku: item.sku,
		name: item.name,
		unit: item.unit,
		quantity,
		unitPriceCents: item.unitPriceCents,
		createdBy: user.id
	});
}

export async function removePart(user: SessionUser, id: string, partId: string) {
	const v = await serviceVisitFor(user, id);
	open(v);
	await db
		.delete(serviceVisitParts)
		.where(and(eq(serviceVisitParts.id, partId), eq(serviceVisitParts.serviceVisitId, id)));
}

/** The visit's invoice: the plan's price for the visit (unless the year is paid) plus the parts. */
export async function visitInvoice(visitId: string) {
	const [v] = await db.select().from(serviceVisits).where(eq(serviceVisits.id, visitId));
	if (!v) throw new CareError('not_found', 'There is no such service visit.');
	const parts = await partsOf(visitId);
	const lines = [
		{
			description: `${VISIT_LABELS[v.kind as VisitKind] ?? v.kind}${v.billedPerVisit ? '' : ' (paid with your yearly plan)'}`,
			amountCents: v.billedPerVisit ? v.priceCents : 0
		},
		...parts.map((p) => ({
			description: `${p.name}: ${p.quantity} ${p.unit} at ${formatCents(p.unitPriceCents)}`,
			amountCents: Math.round(p.quantity * p.unitPriceCents)
		}))
	];
	return {
		lines,
		totalCents: lines.reduce((n, l) => n + l.amountCents, 0),
		paid: Boolean(v.paidAt)
	};
}

/**
 * Marks the visit done (every checklist item ticked) and mails the homeowner a short report
 * with the photos and, when something is owed, the link to pay. Once: the status is checked
 * under a row lock and the mail has a key of its own.
 */
export async function completeServiceVisit(user: SessionUser, id: string): Promise<void> {
	await serviceVisitFor(user, id);
	const attachments = await serviceVisitPhotoAttachments(id);
	const ids = await db.transaction(async (tx) => {
		const [v] = await tx.select().from(serviceVisits).where(eq(serviceVisits.id, id)).for('update');
		open(v);
		const left = v.checklist.filter((c) => !c.done).length;
		if (left) {
			throw new CareError(
				'invalid',
				`${left} checklist item${left === 1 ? ' is' : 's are'} not ticked yet.`
			);
		}
		await tx
			.update(serviceVisits)
			.set({ status: 'done', doneAt: new Date(), doneBy: user.id })
			.where(eq(serviceVisits.id, id));
		const [p] = await tx
			.select({ property: properties, contact: contacts })
			.from(properties)
			.innerJoin(contacts, eq(contacts.id, properties.contactId))
			.where(eq(properties.id, v.propertyId));
		if (!p.contact.email) return [];
		const invoice = await visitInvoice(id);
		const firm = await firmOn(tx);
		const token = await newCareLink(v.propertyId, v.id, tx);
		const label = VISIT_LABELS[v.kind as VisitKind] ?? v.kind;
		const mail = build(
			firm,
			`${label} done at ${addressOf(p.property)}`,
			[
				`Hello ${p.contact.name},`,
				`We finished the ${label.toLowerCase()} today.`,
				...v.checklist.map((c) => `✓ ${c.item}`),
				...(v.notes ? [`Notes from the crew: ${v.notes}`] : []),
				attachments.length
					? `${attachments.length} photo${attachments.length === 1 ? ' is' : 's are'} attached.`
					: '',
				invoice.totalCents > 0
					? `Invoice for this visit: ${formatCents(invoice.totalCents)} (${invoice.lines
							.filter((l) => l.amountCents > 0)
							.map((l) => l.description)
							.join('; ')}). You can pay by card from the link below.`
					: 'Nothing is owed for this visit.'
			].filter(Boolean),
			{
				label:
					invoice.totalCents > 0
						? `Pay ${formatCents(invoice.totalCents)} and see the report`
						: 'See the report',
				url: `${origin()}/care/visit/${token}`
			}
		);
		const outboxId = await writeMail(
			{ ...mail, to: p.contact.email, dedupeKey: `care-report:${v.id}`, attachments },
			tx
		);
		return outboxId ? [outboxId] : [];
	});
	await dispatchAll(ids);
}

/** The visit behind a homeowner's visit link. */
export async function visitForLink(token: string) {
	const link = await careLink(token);
	if (!link?.serviceVisitId) return null;
	const [v] = await db
		.select()
		.from(serviceVisits)
		.where(eq(serviceVisits.id, link.serviceVisitId));
	return v ?? null;
}

/** What the homeowner's visit page shows: the day, the visits that day, and after it the report. */
export async function homeownerVisit(v: ServiceVisit) {
	const firm = await firmOn(db);
	const sameDay = v.day
		? await db
				.select()
				.from(serviceVisits)
				.where(
					and(
						eq(serviceVisits.propertyId, v.propertyId),
						eq(serviceVisits.day, v.day),
						ne(serviceVisits.status, 'cancelled')
					)
				)
		: [v];
	const [p] = await db.select().from(properties).where(eq(properties.id, v.propertyId));
	return {
		firm: { name: firm.firmName, phone: firm.phone, email: firm.email },
		address: addressOf(p),
		visit: v,
		labels: [...new Set(sameDay.map((s) => VISIT_LABELS[s.kind as VisitKind] ?? s.kind))],
		invoice: v.status === 'done' ? await visitInvoice(v.id) : null
	};
}

/** The homeowner asks for another day; the office is told by mail. */
export async function requestAnotherDay(v: ServiceVisit, message: string): Promise<void> {
	if (v.status !== 'due' && v.status !== 'dated') {
		throw new CareError('invalid', 'This visit can no longer be moved.');
	}
	const ids = await db.transaction(async (tx) => {
		await tx
			.update(serviceVisits)
			.set({ changeRequest: message, changeRequestedAt: new Date() })
			.where(eq(serviceVisits.id, v.id));
		const firm = await firmOn(tx);
		const [p] = await tx
			.select({ property: properties, contact: contacts })
			.from(properties)
			.innerJoin(contacts, eq(contacts.id, properties.contactId))
			.where(eq(properties.id, v.propertyId));
		const mail = build(firm, `Another day asked: ${p.contact.name}`, [
			`${p.contact.name} (${addressOf(p.property)}) asks for another day than ${v.day ? dayText(v.day) : 'the one planned'} for the ${(VISIT_LABELS[v.kind as VisitKind] ?? v.kind).toLowerCase()}.`,
			`Their words: ${message}`,
			`Move the visit on the season page under Care; the homeowner is mailed the new day from there.`
		]);
		const id = await writeMail(
			{ ...mail, to: firm.email, dedupeKey: `care-day-request:${v.id}:${newId()}` },
			tx
		);
		return id ? [id] : [];
	});
	await dispatchAll(ids);
}

/** Starts (or reuses) the provider checkout for a done visit's invoice. */
export async function startVisitCheckout(v: ServiceVisit, token: string): Promise<string> {
	const invoice = await visitInvoice(v.id);
	if (v.status !== 'done' || invoice.paid || invoice.totalCents <= 0) {
		throw new CareError('invalid', 'Nothing is owed for this visit.');
	}
	const [openCheckout] = await db
		.select()
		.from(careCheckouts)
		.where(and(eq(careCheckouts.serviceVisitId, v.id), eq(careCheckouts.status, 'open')));
	if (openCheckout && openCheckout.amountCents === invoice.totalCents) {
		const session = await paymentsClient().checkout.sessions.retrieve(
			openCheckout.providerSessionId
		);
		if (session.status === 'open' && session.url) return session.url;
	}
	const base = `${origin()}/care/visit/${encodeURIComponent(token)}`;
	const session = await createCheckout({
		amountCents: invoice.totalCents,
		currency: CURRENCY,
		description: `${VISIT_LABELS[v.kind as VisitKind] ?? v.kind}${v.day ? ` on ${dayText(v.day)}` : ''}`,
		reference: v.id,
		successUrl: `${base}/paid?session={CHECKOUT_SESSION_ID}`,
		cancelUrl: `${base}?cancelled=1`,
		metadata: { careServiceVisitId: v.id }
	});
	await db.insert(careCheckouts).values({
		id: newId(),
		serviceVisitId: v.id,
		amountCents: invoice.totalCents,
		currency: CURRENCY,
		providerSessionId: session.id,
		url: session.url
	});
	return session.url;
}

/** A crew lead's service visits from `from` to `to` (inclusive), in route order. */
export async function crewServiceDays(user: SessionUser, from: string, to: string) {
	return db
		.select({
			id: serviceVisits.id,
			day: serviceVisits.day,
			kind: serviceVisits.kind,
			status: serviceVisits.status,
			routeOrder: serviceVisits.routeOrder,
			name: contacts.name,
			street: properties.street,
			town: properties.town
		})
		.from(serviceVisits)
		.innerJoin(properties, eq(properties.id, serviceVisits.propertyId))
		.innerJoin(contacts, eq(contacts.id, properties.contactId))
		.where(
			and(
				eq(serviceVisits.crewLeadId, user.id),
				gte(serviceVisits.day, from),
				lte(serviceVisits.day, to),
				sql`${serviceVisits.status} in ('dated', 'done')`
			)
		)
		.orderBy(asc(serviceVisits.day), asc(serviceVisits.routeOrder));
}

/** A subscription's service visits, earliest window first. */
export async function visitsOfSubscription(subscriptionId: string) {
	return db
		.select()
		.from(serviceVisits)
		.where(eq(serviceVisits.subscriptionId, subscriptionId))
		.orderBy(serviceVisits.windowStart);
}
