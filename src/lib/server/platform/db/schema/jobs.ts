// Jobs: one per accepted estimate (unique estimate id), install days, crew lead, materials from
// the takeoff, change orders (with the same acceptance record as an estimate), punch list and
// testimonials.
import {
	boolean,
	date,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { JOB_STAGES } from '../../../../stages';
import { createdAt, updatedAt } from './columns';
import { users } from './auth';
import { contacts, leads, properties } from './leads';
import { estimates } from './estimates';

export const jobStageEnum = pgEnum('job_stage', JOB_STAGES);
export type JobStage = (typeof jobStageEnum.enumValues)[number];

/** What the job was sold as, frozen at conversion: the estimate, the choices and the acceptance. */
export interface FrozenEstimate {
	estimateId: string;
	number: number;
	revision: number;
	scope: string;
	design: Record<string, unknown>;
	result: Record<string, unknown>;
	/** From the engine's result: the stones (crew size) and the cautions shown to the crew. */
	engine?: { stones: unknown; cautions: unknown };
	choices: { options: string[]; alternates: Record<string, string> };
	acceptance: {
		typedName: string;
		acceptedAt: string;
		ipAddress: string | null;
		userAgent: string | null;
		/** 'link' when the homeowner accepted online; 'paper' or 'phone' when staff recorded it. */
		method: 'link' | 'paper' | 'phone';
		recordedBy: string | null;
	};
	totalCents: number;
	depositCents: number;
}

export const jobs = pgTable(
	'jobs',
	{
		id: text('id').primaryKey(),
		/** The job number staff and crew use (J-501 …). */
		number: integer('number').generatedAlwaysAsIdentity({ startWith: 501 }).notNull().unique(),
		/** Unique: an estimate converts into one job, however often conversion is asked for. */
		estimateId: text('estimate_id')
			.notNull()
			.unique()
			.references(() => estimates.id),
		leadId: text('lead_id')
			.notNull()
			.references(() => leads.id),
		contactId: text('contact_id')
			.notNull()
			.references(() => contacts.id),
		propertyId: text('property_id').references(() => properties.id),
		stage: jobStageEnum('stage').notNull().default('scheduled'),
		title: text('title').notNull(),
		frozen: jsonb('frozen').$type<FrozenEstimate>().notNull(),
		contractCents: integer('contract_cents').notNull(),
		depositDueCents: integer('deposit_due_cents').notNull(),
		/** People the heaviest stone needs (from the engine), suggested for the crew. */
		crewNeeded: integer('crew_needed').notNull().default(0),
		crewSize: integer('crew_size'),
		crewLeadId: text('crew_lead_id').references(() => users.id),
		isWaterFeature: boolean('is_water_feature').notNull().default(false),
		startedAt: timestamp('started_at', { withTimezone: true }),
		completedAt: timestamp('completed_at', { withTimezone: true }),
		/** Set at completion: contract + approved change orders − payments. */
		finalBalanceCents: integer('final_balance_cents'),
		paidAt: timestamp('paid_at', { withTimezone: true }),
		careOptOutAt: timestamp('care_opt_out_at', { withTimezone: true }),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('jobs_stage_idx').on(t.stage), index('jobs_crew_lead_idx').on(t.crewLeadId)]
);

/** The install days of a job (one row per calendar day in the firm's time zone). */
export const jobDays = pgTable(
	'job_days',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		day: date('day').notNull(),
		createdAt: createdAt()
	},
	(t) => [
		uniqueIndex('job_days_job_day_idx').on(t.jobId, t.day),
		index('job_days_day_idx').on(t.day)
	]
);

/** The job a row belongs to, deleted with it. */
export const ofJob = () =>
	text('job_id')
		.notNull()
		.references(() => jobs.id, { onDelete: 'cascade' });

export const jobMaterials = pgTable(
	'job_materials',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		category: text('category').notNull(),
		sku: text('sku').notNull().default(''),
		name: text('name').notNull(),
		description: text('description').notNull().default(''),
		unit: text('unit').notNull(),
		/** Negative for a line a change order removed. */
		quantity: doublePrecision('quantity').notNull(),
		/** Set when the line came from an approved change order. */
		changeOrderId: text('change_order_id'),
		orderedAt: timestamp('ordered_at', { withTimezone: true }),
		pickedAt: timestamp('picked_at', { withTimezone: true }),
		pickedBy: text('picked_by').references(() => users.id),
		sortOrder: integer('sort_order').notNull().default(0),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('job_materials_job_idx').on(t.jobId, t.sortOrder)]
);

export const changeOrderStatusEnum = pgEnum('change_order_status', [
	'draft',
	'sent',
	'approved',
	'declined'
]);
export type ChangeOrderStatus = (typeof changeOrderStatusEnum.enumValues)[number];

export interface ChangeOrderLine {
	description: string;
	category: string;
	unit: string;
	/** Negative to remove work or material from the job. */
	quantity: number;
	unitPriceCents: number;
	extendedCents: number;
}

export const changeOrders = pgTable(
	'change_orders',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		/** CO-1, CO-2 … per job. */
		number: integer('number').notNull(),
		status: changeOrderStatusEnum('status').notNull().default('draft'),
		title: text('title').notNull(),
		note: text('note').notNull().default(''),
		lines: jsonb('lines').$type<ChangeOrderLine[]>().notNull(),
		/** Signed: what the change adds to (or takes off) the job's total. */
		totalCents: integer('total_cents').notNull(),
		tokenHash: text('token_hash').unique(),
		tokenExpiresAt: timestamp('token_expires_at', { withTimezone: true }),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		// The homeowner's decision, recorded as an estimate's acceptance is.
		typedName: text('typed_name'),
		decidedAt: timestamp('decided_at', { withTimezone: true }),
		ipAddress: text('ip_address'),
		userAgent: text('user_agent'),
		acceptedTotalCents: integer('accepted_total_cents'),
		declineReason: text('decline_reason'),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [uniqueIndex('change_orders_job_number_idx').on(t.jobId, t.number)]
);

export const punchItems = pgTable(
	'punch_items',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		body: text('body').notNull(),
		doneAt: timestamp('done_at', { withTimezone: true }),
		doneBy: text('done_by').references(() => users.id),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [index('punch_items_job_idx').on(t.jobId)]
);

/** One request per job; shown on the public Kind words page once the owner approves it. */
export const testimonials = pgTable('testimonials', {
	id: text('id').primaryKey(),
	jobId: text('job_id')
		.notNull()
		.unique()
		.references(() => jobs.id, { onDelete: 'cascade' }),
	tokenHash: text('token_hash').notNull().unique(),
	tokenExpiresAt: timestamp('token_expires_at', { withTimezone: true }).notNull(),
	body: text('body'),
	displayName: text('display_name'),
	town: text('town'),
	submittedAt: timestamp('submitted_at', { withTimezone: true }),
	approvedAt: timestamp('approved_at', { withTimezone: true }),
	approvedBy: text('approved_by').references(() => users.id),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** One row: when seasonal care reminders go out, and how long after completion to ask for words. */
export type Job = typeof jobs.$inferSelect;
export type JobDay = typeof jobDays.$inferSelect;
export type JobMaterial = typeof jobMaterials.$inferSelect;
export type ChangeOrder = typeof changeOrders.$inferSelect;
export type PunchItem = typeof punchItems.$inferSelect;
export type Testimonial = typeof testimonials.$inferSelect;
