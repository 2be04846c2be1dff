// The mail that tells each homeowner the day of their care visits, with a link to ask for
// another.
import { and, eq, inArray, isNotNull, isNull, ne, or } from 'drizzle-orm';
import { db } from '../platform/db';
import { careSubscriptions, contacts, properties, serviceVisits } from '../platform/db/schema';
import { sha256 } from '../platform/crypto';
import { origin } from '../platform/env';
import { writeMail } from '../platform/outbox';
import { firmOn } from '../payments/mail';
import { dispatchAll } from '../payments/ledger';
import { VISIT_LABELS } from '$lib/care/kinds';
import { addressOf } from './features';
import { newCareLink } from './links';
import { build, dayText } from './mail';

/**
 * Mails each homeowner the day of their visits (one mail per property and day) with a link to
 * ask for another; a visit moved after its mail is mailed again. Cancelled plans get nothing.
 */
export async function sendDates(key: string): Promise<number> {
	const rows = await db
		.select({ v: serviceVisits })
		.from(serviceVisits)
		.innerJoin(careSubscriptions, eq(careSubscriptions.id, serviceVisits.subscriptionId))
		.where(
			and(
				eq(serviceVisits.season, key),
				inArray(serviceVisits.status, ['due', 'dated']),
				isNotNull(serviceVisits.day),
				eq(careSubscriptions.status, 'active'),
				or(isNull(serviceVisits.notifiedDay), ne(serviceVisits.notifiedDay, serviceVisits.day))
			)
		);
	const groups = new Map<string, typeof rows>();
	for (const r of rows) {
		const k = `${r.v.propertyId}|${r.v.day}`;
		groups.set(k, [...(groups.get(k) ?? []), r]);
	}
	let sent = 0;
	for (const group of groups.values()) {
		const ids = await db.transaction(async (tx) => {
			const first = group[0].v;
			const [p] = await tx
				.select({ property: properties, contact: contacts })
				.from(properties)
				.innerJoin(contacts, eq(contacts.id, properties.contactId))
				.where(eq(properties.id, first.propertyId));
			await tx
				.update(serviceVisits)
				.set({ status: 'dated', notifiedDay: first.day })
				.where(
					inArray(
						serviceVisits.id,
						group.map((r) => r.v.id)
					)
				);
			if (!p.contact.email) return [];
			const firm = await firmOn(tx);
			const token = await newCareLink(first.propertyId, first.id, tx);
			const kinds = [
				...new Set(group.map((r) => VISIT_LABELS[r.v.kind as keyof typeof VISIT_LABELS]))
			];
			const mail = build(
				firm,
				`Your ${kinds.join(' and ').toLowerCase()}: ${dayText(first.day!)}`,
				[
					`Hello ${p.contact.name},`,
					`We will come to ${addressOf(p.property)} on ${dayText(first.day!)} for the ${kinds.join(' and ').toLowerCase()} of your care plan. You need not be home; please leave the gate unlocked and the outdoor outlet on.`,
					`If the day does not suit you, ask for another from the link below.`
				],
				{ label: 'See the visit or ask for another day', url: `${origin()}/care/visit/${token}` }
			);
			const dedupe = sha256(
				group
					.map((r) => r.v.id)
					.sort()
					.join(',')
			);
			const id = await writeMail(
				{ ...mail, to: p.contact.email, dedupeKey: `care-visit-date:${dedupe}:${first.day}` },
				tx
			);
			return id ? [id] : [];
		});
		sent += ids.length;
		await dispatchAll(ids);
	}
	return sent;
}
