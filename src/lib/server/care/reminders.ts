// Seasonal care for water-feature jobs in frost country: an autumn shut-down and a spring
// start-up reminder, each sent once per season per job (unique job + season), chained through
// pg-boss (each reminder queues the next), with an unsubscribe link that works.
import { TZDate } from '@date-fns/tz';
import { and, eq } from 'drizzle-orm';
import { db, type Db } from '../platform/db';
import {
	careReminders,
	careSettings as careSettingsTable,
	contacts,
	jobs,
	type Job
} from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { dispatchMail, writeMail } from '../platform/outbox';
import { defineJob, enqueue } from '../platform/queue';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';
import { careReminderMail } from '../jobs/mail';
import { reminderCare } from './offers';

export type CareKind = 'shutdown' | 'startup';
export const CARE_JOB = 'care.remind';
const SEND_HOUR = 9;

export const CARE_DEFAULTS = {
	enabled: true,
	shutdownMonth: 10,
	startupMonth: 4,
	testimonialDelayDays: 3
};

export async function careSettings(tx: Db = db) {
	const [row] = await tx.select().from(careSettingsTable).where(eq(careSettingsTable.id, 1));
	return row ?? { id: 1, ...CARE_DEFAULTS };
}

export async function saveCareSettings(input: typeof CARE_DEFAULTS): Promise<void> {
	await db
		.insert(careSettingsTable)
		.values({ id: 1, ...input })
		.onConflictDoUpdate({ target: careSettingsTable.id, set: input });
}

/** The next reminder after `after`: the 1st of the shut-down or start-up month, 09:00 firm time. */
export function nextCareDate(
	after: Date,
	months: { shutdownMonth: number; startupMonth: number },
	timeZone: string
): { kind: CareKind; season: string; at: Date } {
	const year = new TZDate(after.getTime(), timeZone).getFullYear();
	const candidates: { kind: CareKind; season: string; at: Date }[] = [];
	for (const y of [year, year + 1]) {
		for (const kind of ['shutdown', 'startup'] as const) {
			const month = kind === 'shutdown' ? months.shutdownMonth : months.startupMonth;
			const at = new Date(new TZDate(y, month - 1, 1, SEND_HOUR, 0, 0, timeZone).getTime());
			candidates.push({ kind, season: `${kind}-${y}`, at });
		}
	}
	return candidates
		.filter((c) => c.at.getTime() > after.getTime())
		.sort((a, b) => a.at.getTime() - b.at.getTime())[0];
}

async function queueNext(jobId: string, after: Date): Promise<void> {
	const [s, firm] = await Promise.all([careSettings(), firmSettings()]);
	const next = nextCareDate(after, s, firm.timeZone);
	await enqueue(
		CARE_JOB,
		{ jobId, season: next.season },
		{ startAfter: next.at, singletonKey: `${jobId}:${next.season}` }
	);
}

/** Called at completion: the first reminder is queued after the commit. */
export async function scheduleCareAfterCompletion(job: Job): Promise<() => Promise<void>> {
	return () => queueNext(job.id, new Date());
}

export type CareOutcome =
	| 'sent'
	| 'already-sent'
	| 'opted-out'
	| 'disabled'
	| 'no-email'
	| 'missing'
	// The homeowner's care plan has already mailed them this season's visit day.
	| 'covered';

/**
 * Sends one season's reminder for one job. Running it twice sends once: the (job, season) row
 * is unique and the outbox key is the same; an SMTP outage leaves the outbox row to be retried.
 */
export async function sendCareReminder(
	jobId: string,
	season: string,
	options: { chain?: boolean } = {}
): Promise<CareOutcome> {
	const kind: CareKind = season.startsWith('shutdown') ? 'shutdown' : 'startup';
	const firm = await firmSettings();
	const settings = await careSettings();
	const token = newToken();
	const outcome = await db.transaction(async (tx) => {
		const [job] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
		if (!job) return { outcome: 'missing' as const };
		if (job.careOptOutAt) return { outcome: 'opted-out' as const };
		if (!settings.enabled) return { outcome: 'disabled' as const };
		const [existing] = await tx
			.select()
			.from(careReminders)
			.where(and(eq(careReminders.jobId, jobId), eq(careReminders.season, season)));
		if (existing) return { outcome: 'already-sent' as const, outboxId: existing.outboxId };
		const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
		if (!contact?.email) return { outcome: 'no-email' as const };
		const care = job.propertyId
			? await reminderCare(tx, job.propertyId, kind, Number(season.slice(-4)))
			: null;
		if (care?.covered) {
			const kept = await tx
				.insert(careReminders)
				.values({ id: newId(), jobId, season, outboxId: null, tokenHash: sha256(token) })
				.onConflictDoNothing()
				.returning({ id: careReminders.id });
			return { outcome: kept.length ? ('covered' as const) : ('already-sent' as const) };
		}
		const mail = careReminderMail({
			care: care ?? undefined,
			firm,
			name: contact.name,
			kind,
			jobTitle: job.title,
			unsubscribeUrl: `${origin()}/care/unsubscribe/${token}`
		});
		const outboxId = await writeMail(
			{ dedupeKey: `care:${jobId}:${season}`, to: contact.email, ...mail, leadId: job.leadId },
			tx
		);
		const inserted = await tx
			.insert(careReminders)
			.values({ id: newId(), jobId, season, outboxId, tokenHash: sha256(token) })
			.onConflictDoNothing()
			.returning({ id: careReminders.id });
		if (!inserted.length) return { outcome: 'already-sent' as const };
		return { outcome: 'sent' as const, outboxId };
	});
	// Dispatching again for an already-recorded reminder is harmless (the outbox sends once) and
	// rescues a run that stopped between its commit and its dispatch.
	if ('outboxId' in outcome && outcome.outboxId) await dispatchMail(outcome.outboxId);
	if (
		options.chain !== false &&
		(outcome.outcome === 'sent' || outcome.outcome === 'disabled' || outcome.outcome === 'covered')
	) {
		await queueNext(jobId, new Date());
	}
	return outcome.outcome;
}

export async function careJobForToken(token: string) {
	const [job] = await db
		.select({ id: jobs.id, title: jobs.title, optedOut: jobs.careOptOutAt })
		.from(careReminders)
		.innerJoin(jobs, eq(jobs.id, careReminders.jobId))
		.where(eq(careReminders.tokenHash, sha256(token)));
	return job ?? null;
}

/** Stops every later reminder of the job whose reminder carried this link. */
export async function unsubscribeCare(token: string): Promise<boolean> {
	const job = await careJobForToken(token);
	if (!job) return false;
	if (!job.optedOut) {
		await db.update(jobs).set({ careOptOutAt: new Date() }).where(eq(jobs.id, job.id));
	}
	return true;
}

defineJob<{ jobId: string; season: string }>(CARE_JOB, async ({ jobId, season }) => {
	await sendCareReminder(jobId, season);
});
