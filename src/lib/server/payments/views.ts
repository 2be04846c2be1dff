// What the homeowner's pages show: the job, what is due now, payments received, invoices.
import { eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { contacts, type Job } from '../platform/db/schema';
import { firmSettings } from '../platform/settings';
import { jobRef } from '../jobs/labels';
import { jobMoney, paymentsOf } from './ledger';
import { ensureInvoice, invoicesOf } from './invoices';

export async function homeownerView(job: Job) {
	const firm = await firmSettings();
	const money = await jobMoney(job);
	// The invoice for what is due now exists before the homeowner pays (one per kind, ever).
	if (money.due) await ensureInvoice(job.id, money.due.kind);
	const [contact] = await db.select().from(contacts).where(eq(contacts.id, job.contactId));
	return {
		firm: { name: firm.firmName, phone: firm.phone, email: firm.email },
		job: { ref: jobRef(job.number), title: job.title, stage: job.stage },
		homeowner: contact?.name ?? '',
		money: {
			totalCents: money.totalCents,
			paidCents: money.paidCents,
			balanceCents: money.balanceCents,
			depositDueCents: money.depositDueCents,
			readyToSchedule: money.readyToSchedule,
			creditCents: money.creditCents,
			due: money.due
		},
		payments: (await paymentsOf(job.id)).map((p) => ({
			id: p.id,
			kind: p.kind,
			method: p.method,
			amountCents: p.amountCents,
			receivedOn: p.receivedOn,
			reason: p.reason
		})),
		invoices: (await invoicesOf(job.id)).map((i) => ({
			number: i.number,
			kind: i.kind,
			balanceDueCents: i.balanceDueCents,
			issuedAt: i.issuedAt,
			dueOn: i.dueOn
		}))
	};
}
