// The job costing page's figures and the completed jobs' margins: rows gathered here, the
// arithmetic in $lib/costing/profit (pure, tested against a hand-worked job).
import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	contacts,
	costingSettings,
	estimates,
	jobCosts,
	jobMaterials,
	jobs,
	materialUsage,
	timeEntries,
	type Job
} from '../platform/db/schema';
import { includedBuckets } from '../jobs/materials';
import { jobBalance } from '../payments/balance';
import { jobCosting, type Costing } from '$lib/costing/profit';
import { ensureJobTasks } from './tasks';
import { receivedCosts } from '../purchasing/orders';

export interface CostingSettingsRow {
	overrunPercent: number;
	learnFromJobs: number;
	warrantyMonths: number;
}

export const DEFAULT_COSTING_SETTINGS: CostingSettingsRow = {
	overrunPercent: 15,
	learnFromJobs: 10,
	warrantyMonths: 12
};

export async function costingConfig(): Promise<CostingSettingsRow> {
	const [row] = await db.select().from(costingSettings).where(eq(costingSettings.id, 1));
	return row
		? {
				overrunPercent: row.overrunPercent,
				learnFromJobs: row.learnFromJobs,
				warrantyMonths: row.warrantyMonths
			}
		: DEFAULT_COSTING_SETTINGS;
}

export async function saveCostingConfig(input: CostingSettingsRow): Promise<void> {
	await db
		.insert(costingSettings)
		.values({ id: 1, ...input })
		.onConflictDoUpdate({ target: costingSettings.id, set: input });
}

interface PricedLine {
	bucket?: string;
	sku?: string;
	description?: string;
	costCents?: number;
}

/** The labor cost an hour the estimate was priced with (the chosen rate, else the first). */
export function laborCostPerHour(catalog: Record<string, unknown> | null): number {
	const c = (catalog ?? {}) as {
		laborRates?: { id: string; costPerHourCents: number }[];
		settings?: { labor?: { rateId?: string } };
	};
	const rates = Array.isArray(c.laborRates) ? c.laborRates : [];
	const wanted = c.settings?.labor?.rateId;
	const rate = rates.find((r) => r.id === wanted) ?? rates[0];
	return Number(rate?.costPerHourCents ?? 0);
}

/** Each material line's estimated cost: its takeoff line's cost (change-order lines: none). */
function estimatedCosts(
	job: Job,
	materials: { id: string; sku: string; description: string; changeOrderId: string | null }[]
) {
	const included = includedBuckets(job.frozen.choices);
	const lines = (
		Array.isArray(job.frozen.result.lines) ? job.frozen.result.lines : []
	) as PricedLine[];
	const pool = lines.filter((l) => included.has(l.bucket ?? 'base'));
	const used = new Set<PricedLine>();
	const out = new Map<string, number>();
	for (const m of materials) {
		if (m.changeOrderId) {
			out.set(m.id, 0);
			continue;
		}
		const line = pool.find(
			(l) => !used.has(l) && (l.sku ?? '') === m.sku && (l.description ?? '') === m.description
		);
		if (line) used.add(line);
		out.set(m.id, Math.round(Number(line?.costCents ?? 0)));
	}
	return out;
}

/** Every figure of one job's costing page. */
export async function costingOf(job: Job) {
	const [tasks, entries, materials, usage, costs, balance, config, estimate, received] =
		await Promise.all([
			ensureJobTasks(job),
			db
				.select({
					taskId: timeEntries.taskId,
					callbackId: timeEntries.callbackId,
					minutes: timeEntries.minutes
				})
				.from(timeEntries)
				.where(eq(timeEntries.jobId, job.id)),
			db
				.select()
				.from(jobMaterials)
				.where(eq(jobMaterials.jobId, job.id))
				.orderBy(asc(jobMaterials.sortOrder), asc(jobMaterials.createdAt)),
			db.select().from(materialUsage).where(eq(materialUsage.jobId, job.id)),
			db
				.select()
				.from(jobCosts)
				.where(eq(jobCosts.jobId, job.id))
				.orderBy(asc(jobCosts.incurredOn)),
			jobBalance(job.id),
			costingConfig(),
			db
				.select({ catalog: estimates.catalog })
				.from(estimates)
				.where(eq(estimates.id, job.estimateId)),
			receivedCosts(job.id)
		]);
	// What a received purchase order cost stands in for the invoice until one is typed.
	const receivedOf = new Map<string, number>();
	for (const r of received) {
		if (r.costCents !== null) {
			receivedOf.set(r.materialId, (receivedOf.get(r.materialId) ?? 0) + r.costCents);
		}
	}
	const estCost = estimatedCosts(job, materials);
	const usageOf = new Map(usage.map((u) => [u.materialId, u]));
	const work = entries.filter((e) => !e.callbackId);
	const totals = (job.frozen.result.totals ?? {}) as { taxCents?: number };
	const costing: Costing = jobCosting({
		contractCents: job.contractCents,
		taxCents: Number(totals.taxCents ?? 0),
		changeOrdersCents: balance.changeOrdersCents,
		paymentsCents: balance.paidCents,
		laborCostPerHourCents: laborCostPerHour(estimate[0]?.catalog ?? null),
		tasks: tasks.map((t) => ({
			id: t.id,
			name: t.name,
			estimatedHours: t.estimatedHours,
			actualMinutes: work.filter((e) => e.taskId === t.id).reduce((s, e) => s + e.minutes, 0)
		})),
		callbackMinutes: entries.filter((e) => e.callbackId).reduce((s, e) => s + e.minutes, 0),
		materials: materials.map((m) => {
			const u = usageOf.get(m.id);
			return {
				id: m.id,
				name: m.name,
				unit: m.unit,
				quantity: m.quantity,
				estimatedCostCents: estCost.get(m.id) ?? 0,
				picked: u?.pickedQuantity ?? 0,
				returned: u?.returnedQuantity ?? 0,
				invoiceCostCents: u?.invoiceCostCents ?? receivedOf.get(m.id) ?? null
			};
		}),
		otherCosts: costs.map((c) => ({ kind: c.kind, amountCents: c.amountCents })),
		overrunPercent: config.overrunPercent
	});
	return {
		costing,
		config,
		usage: Object.fromEntries(
			usage.map((u) => [
				u.materialId,
				{
					picked: u.pickedQuantity,
					returned: u.returnedQuantity,
					invoiceCostCents: u.invoiceCostCents,
					invoiceReference: u.invoiceReference
				}
			])
		),
		costs
	};
}

/** Completed (and paid) jobs with their revenue, cost, profit and margin, newest first. */
export async function completedJobs() {
	const rows = await db
		.select()
		.from(jobs)
		.where(and(inArray(jobs.stage, ['complete', 'paid']), isNotNull(jobs.completedAt)))
		.orderBy(asc(jobs.number));
	const names = rows.length
		? await db
				.select({ id: contacts.id, name: contacts.name })
				.from(contacts)
				.where(
					inArray(
						contacts.id,
						rows.map((r) => r.contactId)
					)
				)
		: [];
	const out = [];
	for (const job of rows) {
		const { costing } = await costingOf(job);
		out.push({
			id: job.id,
			number: job.number,
			title: job.title,
			homeowner: names.find((n) => n.id === job.contactId)?.name ?? '',
			completedAt: job.completedAt!,
			revenueCents: costing.revenueCents,
			costCents: costing.actualCostCents,
			profitCents: costing.profitCents,
			marginBasisPoints: costing.marginBasisPoints,
			estimatedHours: costing.labor.estimatedHours,
			actualHours: costing.labor.actualHours
		});
	}
	return out.reverse();
}
