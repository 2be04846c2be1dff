// Invoices: one deposit invoice and one final invoice per job, numbered from a counter row that
// is bumped in the same transaction as the insert. A failed insert rolls the bump back, so the
// numbers have no gaps (a Postgres sequence would keep the number it handed out). The counter
// row's lock also orders concurrent issues.
import { and, asc, eq, sql } from 'drizzle-orm';
import { db, type Tx } from '../platform/db';
import {
	changeOrders,
	contacts,
	invoiceCounter,
	invoices,
	properties,
	type Invoice,
	type InvoiceKind,
	type InvoiceSnapshot
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import { addDays } from '$lib/scheduling/zone';
import { firmToday } from '../platform/settings';
import { firmOn } from './mail';
import { jobRef } from '../jobs/labels';
import { DEPOSIT_TERMS_DAYS, FINAL_TERMS_DAYS, jobMoney, lockJob, paymentsOf } from './ledger';

async function nextNumber(tx: Tx): Promise<number> {
	const [row] = await tx
		.insert(invoiceCounter)
		.values({ id: 1, last: 1 })
		.onConflictDoUpdate({
			target: invoiceCounter.id,
			set: { last: sql`${invoiceCounter.last} + 1` }
		})
		.returning({ last: invoiceCounter.last });
	return row.last;
}

function taxOf(result: Record<string, unknown>): number {
	const totals = result.totals as { taxCents?: unknown } | undefined;
	const n = Number(totals?.taxCents ?? 0);
	return Number.isFinite(n) ? Math.round(n) : 0;
}

async function issueIn(tx: Tx, jobId: string, kind: InvoiceKind): Promise<Invoice> {
	const job = await lockJob(tx, jobId);
	const [existing] = await tx
		.select()
		.from(invoices)
		.where(and(eq(invoices.jobId, jobId), eq(invoices.kind, kind)));
	if (existing) return existing;
	const firm = await firmOn(tx);
	const [contact] = await tx.select().from(contacts).where(eq(contacts.id, job.contactId));
	const [property] = job.propertyId
		? await tx.select().from(properties).where(eq(properties.id, job.propertyId))
		: [];
	const cos = await tx
		.select()
		.from(changeOrders)
		.where(and(eq(changeOrders.jobId, jobId), eq(changeOrders.status, 'approved')))
		.orderBy(asc(changeOrders.number));
	const money = await jobMoney(job, tx);
	const paid = await paymentsOf(jobId, tx);
	const snapshot: InvoiceSnapshot = {
		firm: {
			name: firm.firmName,
			email: firm.email,
			phone: firm.phone,
			address: [firm.street, firm.town, firm.region, firm.postalCode].filter(Boolean).join(', ')
		},
		billTo: {
			name: contact?.name ?? '',
			email: contact?.email ?? null,
			address: property
				? [property.street, property.town, property.postalCode].filter(Boolean).join(', ')
				: ''
		},
		jobNumber: job.number,
		title: job.title,
		lines: [
			{
				description: `Job ${jobRef(job.number)}, as accepted (estimate v${job.frozen.number}): ${job.title}`,
				amountCents: job.contractCents
			},
			...cos.map((co) => ({
				description: `Change order CO-${co.number}: ${co.title}`,
				amountCents: co.acceptedTotalCents ?? co.totalCents
			}))
		],
		payments: paid.map((p) => ({
			receivedOn: p.receivedOn,
			method: p.method,
			reference: p.reference,
			amountCents: p.amountCents
		}))
	};
	const number = await nextNumber(tx);
	const now = new Date();
	const [row] = await tx
		.insert(invoices)
		.values({
			id: newId(),
			number,
			jobId,
			kind,
			snapshot,
			totalCents: money.totalCents,
			taxCents: taxOf(job.frozen.result),
			paymentsCents: money.paidCents,
			balanceDueCents: kind === 'deposit' ? money.depositOutstandingCents : money.balanceCents,
			issuedAt: now,
			// Counted from today on the firm's calendar: the UTC date is already tomorrow in
			// the firm's evening.
			dueOn: addDays(
				await firmToday(tx, now),
				kind === 'deposit' ? DEPOSIT_TERMS_DAYS : FINAL_TERMS_DAYS
			)
		})
		.returning();
	return row;
}

/** The job's invoice of that kind, issued now if it does not exist yet. */
export async function ensureInvoice(jobId: string, kind: InvoiceKind, tx?: Tx): Promise<Invoice> {
	if (tx) return issueIn(tx, jobId, kind);
	return db.transaction((t) => issueIn(t, jobId, kind));
}

export async function invoicesOf(jobId: string) {
	return db.select().from(invoices).where(eq(invoices.jobId, jobId)).orderBy(asc(invoices.number));
}

export async function invoiceByNumber(number: number) {
	if (!Number.isInteger(number) || number <= 0 || number > 2_000_000_000) return null;
	const [row] = await db.select().from(invoices).where(eq(invoices.number, number));
	return row ?? null;
}
