import { and, eq, isNull, sql } from 'drizzle-orm';
import { reminderPlan } from '$lib/scheduling/reminders';
import { db } from '../platform/db';
import { outbox, siteVisits, type SiteVisit } from '../platform/db/schema';
import { dispatchMail } from '../platform/outbox';
import { defineJob, enqueue } from '../platform/queue';
import { writeVisitMails, type VisitMailKind } from './mail';
import { partyFor } from './party';

// ---------------------------------------------------------------------------------------------
// Reminders: one job per visit SEQUENCE; a job for an older sequence finds it stale and stops.
// When it goes out (a day before, three hours before, or not at all) is reminderPlan's choice.

export async function scheduleReminder(visit: SiteVisit, now: Date): Promise<void> {
	const plan = reminderPlan(visit.startsAt, now);
	if (!plan) return; // the visit is only hours away: the invitation just sent stands in
	await enqueue(
		'visit.reminder',
		{ visitId: visit.id, sequence: visit.sequence },
		{ startAfter: plan.at, singletonKey: `visit-reminder:${visit.id}:${visit.sequence}` }
	);
}

export async function sendVisitReminder(
	data: { visitId: string; sequence: number },
	now = new Date()
): Promise<'sent' | 'stale' | 'missing'> {
	const [visit] = await db.select().from(siteVisits).where(eq(siteVisits.id, data.visitId));
	if (!visit) return 'missing';
	if (visit.status !== 'booked' || visit.sequence !== data.sequence || visit.startsAt <= now) {
		return 'stale';
	}
	const prefix = `visit:${visit.id}:${visit.sequence}:reminder:`;
	await db.transaction(async (tx) => {
		const party = await partyFor(tx, visit);
		await writeVisitMails(tx, party, 'reminder' satisfies VisitMailKind, null, now);
	});
	// Written once per sequence (dedupe keys); dispatch whatever of it is still unsent.
	const unsent = await db
		.select({ id: outbox.id })
		.from(outbox)
		.where(and(sql`${outbox.dedupeKey} like ${prefix + '%'}`, isNull(outbox.sentAt)));
	for (const m of unsent) await dispatchMail(m.id);
	return 'sent';
}

defineJob<{ visitId: string; sequence: number }>('visit.reminder', async (data) => {
	await sendVisitReminder(data);
});
