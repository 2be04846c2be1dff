// A job's balance: the contract plus approved change orders, less the payments received (refunds
// are negative payments). The one place this arithmetic is done.
import { and, eq, sql } from 'drizzle-orm';
import { db, type Db } from '../platform/db';
import { changeOrders, jobs, payments } from '../platform/db/schema';
import { JobError } from '../jobs/errors';

export async function approvedChangeOrdersCents(jobId: string, tx: Db = db): Promise<number> {
	const [row] = await tx
		.select({ sum: sql<number>`coalesce(sum(${changeOrders.acceptedTotalCents}), 0)::int` })
		.from(changeOrders)
		.where(and(eq(changeOrders.jobId, jobId), eq(changeOrders.status, 'approved')));
	return row.sum;
}

/** Payments received: card, cheque, cash, transfer; refunds are negative. */
export async function paymentsReceivedCents(jobId: string, tx: Db = db): Promise<number> {
	const [row] = await tx
		.select({ sum: sql<number>`coalesce(sum(${payments.amountCents}), 0)::int` })
		.from(payments)
		.where(eq(payments.jobId, jobId));
	return row.sum;
}

export async function jobBalance(jobId: string, tx: Db = db) {
	const [job] = await tx
		.select({ contractCents: jobs.contractCents, depositDueCents: jobs.depositDueCents })
		.from(jobs)
		.where(eq(jobs.id, jobId));
	if (!job) throw new JobError('not_found', 'There is no such job.');
	const changeOrdersCents = await approvedChangeOrdersCents(jobId, tx);
	const paidCents = await paymentsReceivedCents(jobId, tx);
	const totalCents = job.contractCents + changeOrdersCents;
	return {
		contractCents: job.contractCents,
		changeOrdersCents,
		totalCents,
		paidCents,
		depositDueCents: job.depositDueCents,
		balanceCents: totalCents - paidCents
	};
}
