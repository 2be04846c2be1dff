// The office's list of open balances: every job that owes something now (a deposit not yet
// received, or the balance of a complete job), overdue first, most overdue at the top.
import { and, desc, eq, inArray } from 'drizzle-orm';
import { db } from '../platform/db';
import { contacts, invoices, jobs, type Job } from '../platform/db/schema';
import { addDays, calendarDate, todayIn } from '$lib/scheduling/zone';
import { firmTimeZone } from '../platform/settings';
import { DEPOSIT_TERMS_DAYS, FINAL_TERMS_DAYS, jobMoney, type JobMoney } from './ledger';

const DAY = 86_400_000;

export interface OpenBalance {
	jobId: string;
	number: number;
	title: string;
	stage: Job['stage'];
	contactName: string;
	money: JobMoney;
	dueKind: 'deposit' | 'final';
	dueCents: number;
	dueOn: string;
	daysOverdue: number;
}

export function dueDate(
	job: Job,
	kind: 'deposit' | 'final',
	timeZone: string,
	invoiceDueOn?: string
): string {
	if (invoiceDueOn) return invoiceDueOn;
	const from = kind === 'final' ? (job.completedAt ?? job.createdAt) : job.createdAt;
	const days = kind === 'final' ? FINAL_TERMS_DAYS : DEPOSIT_TERMS_DAYS;
	return addDays(calendarDate(from, timeZone), days);
}

export function sortOpenBalances<T extends { daysOverdue: number; dueOn: string; number: number }>(
	rows: T[]
): T[] {
	return [...rows].sort(
		(a, b) =>
			Number(b.daysOverdue > 0) - Number(a.daysOverdue > 0) ||
			b.daysOverdue - a.daysOverdue ||
			a.dueOn.localeCompare(b.dueOn) ||
			a.number - b.number
	);
}

export async function openBalances(now = new Date()): Promise<OpenBalance[]> {
	const rows = await db
		.select({ job: jobs, contactName: contacts.name })
		.from(jobs)
		.innerJoin(contacts, eq(contacts.id, jobs.contactId))
		.where(inArray(jobs.stage, ['scheduled', 'underway', 'punch_list', 'complete']))
		.orderBy(desc(jobs.number));
	const out: OpenBalance[] = [];
	const timeZone = await firmTimeZone();
	const today = todayIn(timeZone, now);
	for (const { job, contactName } of rows) {
		const money = await jobMoney(job);
		if (!money.due) continue;
		const [invoice] = await db
			.select({ dueOn: invoices.dueOn })
			.from(invoices)
			.where(and(eq(invoices.jobId, job.id), eq(invoices.kind, money.due.kind)));
		const dueOn = dueDate(job, money.due.kind, timeZone, invoice?.dueOn);
		const daysOverdue = Math.max(0, Math.round((Date.parse(today) - Date.parse(dueOn)) / DAY));
		out.push({
			jobId: job.id,
			number: job.number,
			title: job.title,
			stage: job.stage,
			contactName,
			money,
			dueKind: money.due.kind,
			dueCents: money.due.amountCents,
			dueOn,
			daysOverdue
		});
	}
	return sortOpenBalances(out);
}
