// What really went into a job: material quantities picked and returned, the supplier's invoice
// cost of a line, and costs outside labor and materials (a machine hired, a dump fee).
import { and, eq } from 'drizzle-orm';
import { db } from '../platform/db';
import { jobCosts, jobMaterials, materialUsage } from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { jobFor } from '../jobs/read';
import { JobError } from '../jobs/errors';

export async function saveUsage(
	user: SessionUser,
	jobId: string,
	input: {
		materialId: string;
		picked: number;
		returned: number;
		invoiceCost: number | null;
		invoiceReference: string;
	}
): Promise<void> {
	const job = await jobFor(user, jobId);
	const [material] = await db
		.select({ id: jobMaterials.id })
		.from(jobMaterials)
		.where(and(eq(jobMaterials.id, input.materialId), eq(jobMaterials.jobId, job.id)));
	if (!material) throw new JobError('not_found', 'That material is not on this job.');
	const set = {
		pickedQuantity: input.picked,
		returnedQuantity: input.returned,
		invoiceCostCents: input.invoiceCost,
		invoiceReference: input.invoiceReference,
		updatedBy: user.id
	};
	await db
		.insert(materialUsage)
		.values({ materialId: material.id, jobId: job.id, ...set })
		.onConflictDoUpdate({ target: materialUsage.materialId, set });
}

export async function addJobCost(
	user: SessionUser,
	jobId: string,
	input: { kind: 'equipment' | 'other'; description: string; amount: number; incurredOn: string }
): Promise<void> {
	const job = await jobFor(user, jobId);
	await db.insert(jobCosts).values({
		id: newId(),
		jobId: job.id,
		kind: input.kind,
		description: input.description,
		amountCents: input.amount,
		incurredOn: input.incurredOn,
		recordedBy: user.id
	});
}

export async function removeJobCost(user: SessionUser, jobId: string, costId: string) {
	const job = await jobFor(user, jobId);
	const gone = await db
		.delete(jobCosts)
		.where(and(eq(jobCosts.id, costId), eq(jobCosts.jobId, job.id)))
		.returning({ id: jobCosts.id });
	if (!gone.length) throw new JobError('not_found', 'That cost is not on this job.');
}
