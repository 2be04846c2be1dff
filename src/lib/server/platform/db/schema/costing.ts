// Job costing: the job's labor tasks (from the sold estimate, or added on site), the crew's time
// entries (each with the device's idempotency key, so a replayed send stores once), materials
// really picked, returned and invoiced, other costs such as equipment, the costing settings and
// every change of a task-hours rate the owner confirmed from finished jobs.
import { sql } from 'drizzle-orm';
import {
	check,
	date,
	doublePrecision,
	index,
	integer,
	pgTable,
	text,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { byUser } from './auth';
import { jobMaterials, ofJob } from './jobs';
import { at, createdAt, updatedAt } from './columns';

/** A labor line of a job: one of the estimate's tasks (merged by name), or one added on site. */
export const jobTasks = pgTable(
	'job_tasks',
	{
		id: text('id').primaryKey(),
		jobId: ofJob(),
		name: text('name').notNull(),
		/** The task-hours setting the estimate's hours came from ('basinHours', 'stoneHours.cart'…). */
		rateKey: text('rate_key'),
		/** Crew-hours the sold estimate allowed; 0 for a task added on site. */
		estimatedHours: doublePrecision('estimated_hours').notNull().default(0),
		sortOrder: integer('sort_order').notNull().default(0),
		createdBy: byUser('created_by'),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('job_tasks_job_name_idx').on(t.jobId, t.name)]
);

/** Hours one person worked on one task on one day, as the crew lead's phone sent them. */
export const timeEntries = pgTable(
	'time_entries',
	{
		id: text('id').primaryKey(),
		jobId: ofJob(),
		taskId: text('task_id')
			.notNull()
			.references(() => jobTasks.id, { onDelete: 'cascade' }),
		person: text('person').notNull(),
		workDate: date('work_date').notNull(),
		minutes: integer('minutes').notNull(),
		/** Set when the entry was timed with start and stop on the phone. */
		startedAt: at('started_at'),
		endedAt: at('ended_at'),
		note: text('note').notNull().default(''),
		/** Made on the device when the entry is typed: a replay of the same entry stores nothing. */
		clientKey: text('client_key').notNull().unique(),
		/** Set when the hours were spent on a warranty callback (they count against the margin). */
		callbackId: text('callback_id'),
		recordedBy: byUser('recorded_by'),
		createdAt: createdAt()
	},
	(t) => [
		index('time_entries_job_idx').on(t.jobId, t.workDate),
		check('time_entries_minutes', sql`${t.minutes} > 0 and ${t.minutes} <= 1440`)
	]
);

/** What really happened to a material line: picked, returned, and the supplier's invoice cost. */
export const materialUsage = pgTable('material_usage', {
	materialId: text('material_id')
		.primaryKey()
		.references(() => jobMaterials.id, { onDelete: 'cascade' }),
	jobId: ofJob(),
	pickedQuantity: doublePrecision('picked_quantity').notNull().default(0),
	returnedQuantity: doublePrecision('returned_quantity').notNull().default(0),
	/** The supplier's invoice cost of this line, when it has arrived. */
	invoiceCostCents: integer('invoice_cost_cents'),
	invoiceReference: text('invoice_reference').notNull().default(''),
	updatedBy: byUser('updated_by'),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** A cost of the job outside labor and materials: a machine hired, a dump fee, a permit. */
export const jobCosts = pgTable(
	'job_costs',
	{
		id: text('id').primaryKey(),
		jobId: ofJob(),
		kind: text('kind', { enum: ['equipment', 'other'] }).notNull(),
		description: text('description').notNull(),
		amountCents: integer('amount_cents').notNull(),
		incurredOn: date('incurred_on').notNull(),
		recordedBy: byUser('recorded_by'),
		createdAt: createdAt()
	},
	(t) => [index('job_costs_job_idx').on(t.jobId)]
);

/** One row: how far over its estimate a task may run before it stands out, and the warranty. */
export const costingSettings = pgTable('costing_settings', {
	id: integer('id').primaryKey().default(1),
	overrunPercent: integer('overrun_percent').notNull().default(15),
	/** How many finished jobs the learned labor ratios look back over. */
	learnFromJobs: integer('learn_from_jobs').notNull().default(10),
	warrantyMonths: integer('warranty_months').notNull().default(12),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** A task-hours rate the owner changed from what finished jobs showed (kept as a record). */
export const laborRateChanges = pgTable('labor_rate_changes', {
	id: text('id').primaryKey(),
	rateKey: text('rate_key').notNull(),
	fromHours: doublePrecision('from_hours').notNull(),
	toHours: doublePrecision('to_hours').notNull(),
	ratio: doublePrecision('ratio').notNull(),
	jobsCount: integer('jobs_count').notNull(),
	confirmedBy: byUser('confirmed_by'),
	createdAt: createdAt()
});

export type JobTask = typeof jobTasks.$inferSelect;
export type TimeEntry = typeof timeEntries.$inferSelect;
export type MaterialUsage = typeof materialUsage.$inferSelect;
export type JobCost = typeof jobCosts.$inferSelect;
