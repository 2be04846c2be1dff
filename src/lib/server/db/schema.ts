import { sql } from 'drizzle-orm';
import {
	type AnyPgColumn,
	boolean,
	check,
	customType,
	date,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
const updatedAt = () =>
	timestamp('updated_at', { withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date());

export const roleEnum = pgEnum('role', ['owner', 'sales', 'crew']);
export type Role = (typeof roleEnum.enumValues)[number];

export const users = pgTable(
	'users',
	{
		id: text('id').primaryKey(),
		email: text('email').notNull(),
		name: text('name').notNull(),
		role: roleEnum('role').notNull(),
		passwordHash: text('password_hash').notNull(),
		phone: text('phone'),
		disabledAt: timestamp('disabled_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [uniqueIndex('users_email_idx').on(sql`lower(${t.email})`)]
);

// The session id is the SHA-256 of the token in the cookie: a leaked table opens no session.
export const sessions = pgTable(
	'sessions',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		absoluteExpiresAt: timestamp('absolute_expires_at', { withTimezone: true }).notNull(),
		ipAddress: text('ip_address'),
		userAgent: text('user_agent'),
		createdAt: createdAt()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const invitations = pgTable('invitations', {
	id: text('id').primaryKey(),
	tokenHash: text('token_hash').notNull().unique(),
	email: text('email').notNull(),
	name: text('name').notNull(),
	role: roleEnum('role').notNull(),
	invitedBy: text('invited_by')
		.notNull()
		.references(() => users.id),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	acceptedAt: timestamp('accepted_at', { withTimezone: true }),
	revokedAt: timestamp('revoked_at', { withTimezone: true }),
	createdAt: createdAt()
});

export const passwordResets = pgTable('password_resets', {
	id: text('id').primaryKey(),
	tokenHash: text('token_hash').notNull().unique(),
	userId: text('user_id')
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	usedAt: timestamp('used_at', { withTimezone: true }),
	createdAt: createdAt()
});

// Failed sign-ins, kept in the database so several app processes share the throttle.
export const signInAttempts = pgTable(
	'sign_in_attempts',
	{
		id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
		emailKey: text('email_key').notNull(),
		ipAddress: text('ip_address').notNull(),
		succeeded: boolean('succeeded').notNull(),
		createdAt: createdAt()
	},
	(t) => [
		index('sign_in_attempts_email_idx').on(t.emailKey, t.createdAt),
		index('sign_in_attempts_ip_idx').on(t.ipAddress, t.createdAt)
	]
);

/**
 * Failed sign-ins counted per key: `account:<email>` and `address:<ip>` for devices that have not
 * signed in before, `device:<nonce>` for a known device. The delay grows from the count and the
 * time of the last failure; a count whose last failure is a day old starts again.
 */
export const signInThrottles = pgTable('sign_in_throttles', {
	key: text('key').primaryKey(),
	failures: integer('failures').notNull().default(0),
	lastFailureAt: timestamp('last_failure_at', { withTimezone: true }).notNull()
});

/** Fixed-window request counters shared by every app process (inquiry and upload limits). */
export const rateCounters = pgTable(
	'rate_counters',
	{
		key: text('key').notNull(),
		windowStart: timestamp('window_start', { withTimezone: true }).notNull(),
		hits: integer('hits').notNull().default(0)
	},
	(t) => [primaryKey({ columns: [t.key, t.windowStart] })]
);

// One row: the firm's own settings.
export const settings = pgTable('settings', {
	id: integer('id').primaryKey().default(1),
	firmName: text('firm_name').notNull(),
	timeZone: text('time_zone').notNull().default('America/Denver'),
	email: text('email').notNull(),
	phone: text('phone').notNull(),
	street: text('street').notNull().default(''),
	town: text('town').notNull().default(''),
	region: text('region').notNull().default(''),
	postalCode: text('postal_code').notNull().default(''),
	serviceArea: text('service_area').notNull().default(''),
	replyTargetHours: integer('reply_target_hours').notNull().default(24),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

// ---------------------------------------------------------------------------------------------
// People, places and leads

/** A person; found again by e-mail (lower-cased) or by phone digits. */
export const contacts = pgTable(
	'contacts',
	{
		id: text('id').primaryKey(),
		name: text('name').notNull(),
		email: text('email'),
		phone: text('phone'),
		phoneDigits: text('phone_digits'),
		isCustomer: boolean('is_customer').notNull().default(false),
		/**
		 * Set when staff merged this contact into another (the same person under two e-mails): the
		 * row stays, so every name, e-mail and phone ever given stays on record, and each lead keeps
		 * its own contact, so its mail still goes to the address its inquiry gave.
		 */
		mergedIntoId: text('merged_into_id').references((): AnyPgColumn => contacts.id),
		mergedAt: timestamp('merged_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		uniqueIndex('contacts_email_idx').on(t.email),
		index('contacts_phone_idx').on(t.phoneDigits),
		index('contacts_merged_into_idx').on(t.mergedIntoId)
	]
);

export const properties = pgTable(
	'properties',
	{
		id: text('id').primaryKey(),
		contactId: text('contact_id')
			.notNull()
			.references(() => contacts.id, { onDelete: 'cascade' }),
		street: text('street').notNull().default(''),
		town: text('town').notNull().default(''),
		postalCode: text('postal_code').notNull().default(''),
		siteNotes: text('site_notes').notNull().default(''),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('properties_contact_idx').on(t.contactId)]
);

export const leadStageEnum = pgEnum('lead_stage', [
	'new',
	'contacted',
	'visit_booked',
	'estimating',
	'estimate_sent',
	'sold',
	'closed'
]);
export type LeadStage = (typeof leadStageEnum.enumValues)[number];

export const closeReasonEnum = pgEnum('close_reason', [
	'not_a_fit',
	'no_reply',
	'budget',
	'timing',
	'chose_another_firm',
	'other'
]);
export const priorityEnum = pgEnum('priority', ['low', 'normal', 'high']);

export const leads = pgTable(
	'leads',
	{
		id: text('id').primaryKey(),
		/** The reference number the homeowner sees (R-1001 …). */
		number: integer('number').generatedAlwaysAsIdentity({ startWith: 1001 }).notNull().unique(),
		contactId: text('contact_id')
			.notNull()
			.references(() => contacts.id),
		propertyId: text('property_id').references(() => properties.id),
		stage: leadStageEnum('stage').notNull().default('new'),
		services: text('services')
			.array()
			.notNull()
			.default(sql`'{}'::text[]`),
		budget: text('budget').notNull().default('unsure'),
		timeframe: text('timeframe').notNull().default('unsure'),
		heardFrom: text('heard_from').notNull().default(''),
		message: text('message').notNull().default(''),
		source: text('source').notNull().default('website'),
		referenceProject: text('reference_project'),
		assigneeId: text('assignee_id').references(() => users.id),
		priority: priorityEnum('priority').notNull().default('normal'),
		firstReplyAt: timestamp('first_reply_at', { withTimezone: true }),
		lastTouchAt: timestamp('last_touch_at', { withTimezone: true }).notNull().defaultNow(),
		closeReason: closeReasonEnum('close_reason'),
		closeNote: text('close_note'),
		consentAt: timestamp('consent_at', { withTimezone: true }),
		/** Bumped on every staff edit; a save from an older version is refused. */
		version: integer('version').notNull().default(1),
		updatedBy: text('updated_by').references(() => users.id),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		index('leads_stage_idx').on(t.stage, t.createdAt),
		index('leads_assignee_idx').on(t.assigneeId),
		index('leads_created_idx').on(t.createdAt),
		index('leads_contact_idx').on(t.contactId)
	]
);

/** A photo processed and stored in S3; attached to a lead, a visit or a job, or still a draft. */
export const photos = pgTable(
	'photos',
	{
		id: text('id').primaryKey(),
		leadId: text('lead_id').references(() => leads.id, { onDelete: 'cascade' }),
		/** Set while the photo waits for its inquiry to be sent; unclaimed drafts are swept. */
		draftToken: text('draft_token').unique(),
		context: text('context').notNull().default('intake'),
		/** Set for photos taken at a site visit (context 'visit'); issue 6. */
		visitId: text('visit_id').references(() => siteVisits.id, { onDelete: 'set null' }),
		/** Set for photos the crew takes on the job (context 'job'); issue 9. */
		jobId: text('job_id').references(() => jobs.id, { onDelete: 'cascade' }),
		displayKey: text('display_key').notNull(),
		thumbKey: text('thumb_key').notNull(),
		width: integer('width').notNull(),
		height: integer('height').notNull(),
		bytes: integer('bytes').notNull(),
		originalName: text('original_name').notNull().default(''),
		uploadedBy: text('uploaded_by').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [index('photos_lead_idx').on(t.leadId), index('photos_draft_idx').on(t.createdAt)]
);

/** The lead's timeline: inquiry, calls, notes, e-mails, stage changes, assignments, visits… */
export const activities = pgTable(
	'activities',
	{
		id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
		leadId: text('lead_id')
			.notNull()
			.references(() => leads.id, { onDelete: 'cascade' }),
		kind: text('kind').notNull(),
		actorId: text('actor_id').references(() => users.id),
		body: text('body').notNull().default(''),
		data: jsonb('data').$type<Record<string, unknown>>().notNull().default({}),
		createdAt: createdAt()
	},
	(t) => [index('activities_lead_idx').on(t.leadId, t.createdAt)]
);

// ---------------------------------------------------------------------------------------------
// Outgoing e-mail: written first, sent by the queue, marked sent once (idempotent sends)

export const outbox = pgTable(
	'outbox',
	{
		id: text('id').primaryKey(),
		/** What makes this message unique, e.g. "inquiry-ack:<leadId>": the same key is never sent twice. */
		dedupeKey: text('dedupe_key').notNull().unique(),
		to: text('to').notNull(),
		subject: text('subject').notNull(),
		text: text('text').notNull(),
		html: text('html').notNull(),
		attachments: jsonb('attachments')
			.$type<{ filename: string; content: string; contentType: string; encoding?: 'base64' }[]>()
			.notNull()
			.default([]),
		leadId: text('lead_id').references(() => leads.id, { onDelete: 'set null' }),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		attempts: integer('attempts').notNull().default(0),
		lastError: text('last_error'),
		createdAt: createdAt()
	},
	(t) => [index('outbox_unsent_idx').on(t.sentAt)]
);

export type User = typeof users.$inferSelect;
export type Contact = typeof contacts.$inferSelect;
export type Lead = typeof leads.$inferSelect;
export type Photo = typeof photos.$inferSelect;
export type Activity = typeof activities.$inferSelect;
export type Settings = typeof settings.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Issue 8 — estimates: the price list, pump models, labor rates, engine settings, estimates
// (versioned per lead) and the homeowner's acceptance (one per estimate)

export const priceListItems = pgTable(
	'price_list_items',
	{
		sku: text('sku').primaryKey(),
		name: text('name').notNull(),
		category: text('category').notNull(),
		unit: text('unit').notNull(),
		unitCostCents: integer('unit_cost_cents').notNull(),
		unitPriceCents: integer('unit_price_cents').notNull(),
		taxable: boolean('taxable').notNull().default(true),
		tags: text('tags')
			.array()
			.notNull()
			.default(sql`'{}'::text[]`),
		/** Engine attributes that depend on the category: pipe spec, fitting, densities, bag size… */
		attributes: jsonb('attributes').$type<Record<string, unknown>>().notNull().default({}),
		active: boolean('active').notNull().default(true),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('price_list_items_category_idx').on(t.category)]
);

export const pumpModels = pgTable('pump_models', {
	id: text('id').primaryKey(),
	name: text('name').notNull(),
	/** Published head against flow: [{ flowGph, headFt }], flow rising. */
	curve: jsonb('curve').$type<{ flowGph: number; headFt: number }[]>().notNull(),
	watts: integer('watts').notNull(),
	priceCents: integer('price_cents').notNull(),
	costCents: integer('cost_cents'),
	active: boolean('active').notNull().default(true),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

export const laborRates = pgTable('labor_rates', {
	id: text('id').primaryKey(),
	name: text('name').notNull(),
	costPerHourCents: integer('cost_per_hour_cents').notNull(),
	pricePerHourCents: integer('price_per_hour_cents').notNull(),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** One row: the engine's settings (markup, tax, deposit, task hours, limits) and estimate terms. */
export const estimatingSettings = pgTable('estimating_settings', {
	id: integer('id').primaryKey().default(1),
	/** The engine's settings object (src/lib/estimating/schema.ts settingsSchema input). */
	engine: jsonb('engine').$type<Record<string, unknown>>().notNull().default({}),
	terms: text('terms').notNull().default(''),
	validDays: integer('valid_days').notNull().default(30),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

export const estimateStatusEnum = pgEnum('estimate_status', [
	'draft',
	'sent',
	'accepted',
	'declined'
]);
export type EstimateStatus = (typeof estimateStatusEnum.enumValues)[number];

export interface EstimateOverrideRow {
	/** The computed line's key (bucket + sku + description), or a new id for a hand-added line. */
	key: string;
	kind: 'override' | 'added';
	bucket: string;
	description: string;
	unit: string;
	quantity: number;
	unitPriceCents: number;
	unitCostCents: number;
	taxable: boolean;
	/** The engine's values when the line was overridden, kept beside the override. */
	computed?: { quantity: number; unitPriceCents: number };
	reason: string;
}

export const estimates = pgTable(
	'estimates',
	{
		id: text('id').primaryKey(),
		leadId: text('lead_id')
			.notNull()
			.references(() => leads.id, { onDelete: 'cascade' }),
		/** v1, v2, … per lead. */
		number: integer('number').notNull(),
		status: estimateStatusEnum('status').notNull().default('draft'),
		design: jsonb('design').$type<Record<string, unknown>>().notNull(),
		overrides: jsonb('overrides').$type<EstimateOverrideRow[]>().notNull().default([]),
		/** The engine's result with overrides applied, as saved by the server. */
		result: jsonb('result').$type<Record<string, unknown>>(),
		/** The catalog the result was computed with (frozen when sent). */
		catalog: jsonb('catalog').$type<Record<string, unknown>>(),
		scope: text('scope').notNull().default(''),
		totalCents: integer('total_cents').notNull().default(0),
		taxCents: integer('tax_cents').notNull().default(0),
		depositCents: integer('deposit_cents').notNull().default(0),
		/** Bumped on every save; a save from an older revision answers 409. */
		revision: integer('revision').notNull().default(1),
		updatedBy: text('updated_by').references(() => users.id),
		createdBy: text('created_by').references(() => users.id),
		tokenHash: text('token_hash').unique(),
		expiresAt: timestamp('expires_at', { withTimezone: true }),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		sentBy: text('sent_by').references(() => users.id),
		declinedAt: timestamp('declined_at', { withTimezone: true }),
		declineReason: text('decline_reason'),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		uniqueIndex('estimates_lead_number_idx').on(t.leadId, t.number),
		index('estimates_status_idx').on(t.status, t.updatedAt)
	]
);

/** The homeowner's yes: exactly one per estimate (the unique key makes a second one fail). */
export const estimateAcceptances = pgTable('estimate_acceptances', {
	id: text('id').primaryKey(),
	estimateId: text('estimate_id')
		.notNull()
		.unique()
		.references(() => estimates.id, { onDelete: 'cascade' }),
	estimateNumber: integer('estimate_number').notNull(),
	typedName: text('typed_name').notNull(),
	acceptedAt: timestamp('accepted_at', { withTimezone: true }).notNull().defaultNow(),
	ipAddress: text('ip_address'),
	userAgent: text('user_agent'),
	/** The estimate's revision at acceptance and the exact choices made. */
	revision: integer('revision').notNull(),
	optionsChosen: jsonb('options_chosen')
		.$type<{ options: string[]; alternates: Record<string, string> }>()
		.notNull(),
	totalCents: integer('total_cents').notNull(),
	depositCents: integer('deposit_cents').notNull(),
	/** The priced result for those choices, frozen. */
	result: jsonb('result').$type<Record<string, unknown>>().notNull(),
	createdAt: createdAt()
});

export type PriceListItem = typeof priceListItems.$inferSelect;
export type PumpModelRow = typeof pumpModels.$inferSelect;
export type Estimate = typeof estimates.$inferSelect;
export type EstimateAcceptance = typeof estimateAcceptances.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Issue 6: site visits — availability, time off, booked visits (no overlaps, enforced by the
// database with a btree_gist exclusion constraint; see drizzle/*_visits_exclusion.sql)

/** A tstzrange, written and read as its text form, e.g. `["2027-03-15 15:00:00+00","…")`. */
const tstzrange = customType<{ data: string; driverData: string }>({
	dataType: () => 'tstzrange'
});

/** One row per salesperson: weekly hours in the firm's time zone and the booking rules. */
export const availability = pgTable('availability', {
	userId: text('user_id')
		.primaryKey()
		.references(() => users.id, { onDelete: 'cascade' }),
	/** Keyed by weekday, 0 = Sunday: wall-clock intervals such as { start: '08:00', end: '12:00' }. */
	weeklyHours: jsonb('weekly_hours')
		.$type<Record<string, { start: string; end: string }[]>>()
		.notNull()
		.default({}),
	visitMinutes: integer('visit_minutes').notNull().default(60),
	bufferMinutes: integer('buffer_minutes').notNull().default(30),
	noticeMinutes: integer('notice_minutes').notNull().default(120),
	daysAhead: integer('days_ahead').notNull().default(21),
	updatedBy: text('updated_by').references(() => users.id),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** Days off and hours off of one salesperson. */
export const timeOff = pgTable(
	'time_off',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		startsAt: timestamp('starts_at', { withTimezone: true }).notNull(),
		endsAt: timestamp('ends_at', { withTimezone: true }).notNull(),
		reason: text('reason').notNull().default(''),
		createdAt: createdAt()
	},
	(t) => [index('time_off_user_idx').on(t.userId, t.startsAt)]
);

export const visitStatusEnum = pgEnum('visit_status', ['booked', 'cancelled']);

export const siteVisits = pgTable(
	'site_visits',
	{
		id: text('id').primaryKey(),
		leadId: text('lead_id')
			.notNull()
			.references(() => leads.id, { onDelete: 'cascade' }),
		salespersonId: text('salesperson_id')
			.notNull()
			.references(() => users.id),
		status: visitStatusEnum('status').notNull().default('booked'),
		startsAt: timestamp('starts_at', { withTimezone: true }).notNull(),
		endsAt: timestamp('ends_at', { withTimezone: true }).notNull(),
		bufferMinutes: integer('buffer_minutes').notNull(),
		/** [start, end + travel buffer): what the exclusion constraint keeps apart. */
		blocked: tstzrange('blocked').notNull(),
		/** The time zone the visit was booked in (the firm's), written into the invitation. */
		timeZone: text('time_zone').notNull(),
		/** Bumped on every reschedule or cancel: the invitation's SEQUENCE. */
		sequence: integer('sequence').notNull().default(0),
		noteForHomeowner: text('note_for_homeowner').notNull().default(''),
		/** SHA-256 of the homeowner's private link token. */
		tokenHash: text('token_hash').notNull().unique(),
		tokenExpiresAt: timestamp('token_expires_at', { withTimezone: true }).notNull(),
		confirmedAt: timestamp('confirmed_at', { withTimezone: true }),
		changeRequest: text('change_request'),
		changeRequestedAt: timestamp('change_requested_at', { withTimezone: true }),
		cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
		cancelledBy: text('cancelled_by'),
		cancelReason: text('cancel_reason'),
		notes: jsonb('notes').$type<Record<string, unknown>>(),
		notesUpdatedAt: timestamp('notes_updated_at', { withTimezone: true }),
		notesUpdatedBy: text('notes_updated_by').references(() => users.id),
		bookedBy: text('booked_by').references(() => users.id),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		index('site_visits_person_idx').on(t.salespersonId, t.startsAt),
		index('site_visits_lead_idx').on(t.leadId),
		uniqueIndex('site_visits_one_booked_per_lead')
			.on(t.leadId)
			.where(sql`${t.status} = 'booked'`)
	]
);

/**
 * Homeowner links mailed after the first one (each reschedule mail carries a fresh token, since
 * only hashes are stored). Every link of a visit opens it until site_visits.token_expires_at.
 */
export const siteVisitLinks = pgTable(
	'site_visit_links',
	{
		tokenHash: text('token_hash').primaryKey(),
		visitId: text('visit_id')
			.notNull()
			.references(() => siteVisits.id, { onDelete: 'cascade' }),
		createdAt: createdAt()
	},
	(t) => [index('site_visit_links_visit_idx').on(t.visitId)]
);

export type Availability = typeof availability.$inferSelect;
export type TimeOff = typeof timeOff.$inferSelect;
export type SiteVisit = typeof siteVisits.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Issue 9: jobs — one job per accepted estimate (unique estimate id), install days, crew lead,
// materials from the takeoff, change orders (with the same acceptance record as an estimate),
// punch list, testimonials and seasonal care reminders

export const jobStageEnum = pgEnum('job_stage', [
	'scheduled',
	'underway',
	'punch_list',
	'complete',
	'paid'
]);
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
		/** Set at completion for the payments issue: contract + approved change orders − payments. */
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
export const careSettings = pgTable('care_settings', {
	id: integer('id').primaryKey().default(1),
	enabled: boolean('enabled').notNull().default(true),
	/** 1–12: the month of the autumn shut-down reminder (frost country: before the first freeze). */
	shutdownMonth: integer('shutdown_month').notNull().default(10),
	/** 1–12: the month of the spring start-up reminder (after the last hard frost). */
	startupMonth: integer('startup_month').notNull().default(4),
	testimonialDelayDays: integer('testimonial_delay_days').notNull().default(3),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** A reminder sent for one job in one season (e.g. "shutdown-2027"): the unique key makes it once. */
export const careReminders = pgTable(
	'care_reminders',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		season: text('season').notNull(),
		outboxId: text('outbox_id'),
		/** SHA-256 of the token in this reminder's unsubscribe link (every sent link keeps working). */
		tokenHash: text('token_hash').unique(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('care_reminders_job_season_idx').on(t.jobId, t.season)]
);

export type Job = typeof jobs.$inferSelect;
export type JobDay = typeof jobDays.$inferSelect;
export type JobMaterial = typeof jobMaterials.$inferSelect;
export type ChangeOrder = typeof changeOrders.$inferSelect;
export type PunchItem = typeof punchItems.$inferSelect;
export type Testimonial = typeof testimonials.$inferSelect;
export type CareSettings = typeof careSettings.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Issue 10: payments — what was asked of the provider (checkout requests), the payments received
// (online, by hand, refunds as negative amounts), webhook events handled exactly once, the
// homeowner's pay links, and invoices numbered from a counter row (no gaps, unlike a sequence)

export const paymentKindEnum = pgEnum('payment_kind', ['deposit', 'progress', 'final', 'refund']);
export type PaymentKind = (typeof paymentKindEnum.enumValues)[number];
export const paymentMethodEnum = pgEnum('payment_method', [
	'card',
	'cheque',
	'cash',
	'bank_transfer'
]);
export type PaymentMethod = (typeof paymentMethodEnum.enumValues)[number];
export const checkoutStatusEnum = pgEnum('checkout_status', ['open', 'paid', 'expired']);
export const invoiceKindEnum = pgEnum('invoice_kind', ['deposit', 'final']);
export type InvoiceKind = (typeof invoiceKindEnum.enumValues)[number];

/** A hosted checkout the app asked the provider for: the amount and currency it must come back with. */
export const checkoutRequests = pgTable(
	'checkout_requests',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: paymentKindEnum('kind').notNull(),
		amountCents: integer('amount_cents').notNull(),
		currency: text('currency').notNull(),
		providerSessionId: text('provider_session_id').notNull().unique(),
		url: text('url').notNull(),
		status: checkoutStatusEnum('status').notNull().default('open'),
		/** Why a completed checkout was not recorded as a payment (amount or currency mismatch). */
		problem: text('problem'),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('checkout_requests_job_idx').on(t.jobId, t.status)]
);

export const payments = pgTable(
	'payments',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: paymentKindEnum('kind').notNull(),
		method: paymentMethodEnum('method').notNull(),
		/** Signed: refunds are negative. */
		amountCents: integer('amount_cents').notNull(),
		currency: text('currency').notNull().default('usd'),
		/** The provider's checkout session: one payment per checkout, however often it is reported. */
		providerCheckoutId: text('provider_checkout_id').unique(),
		/** Cheque number, transfer reference, provider payment id… */
		reference: text('reference'),
		receivedOn: date('received_on').notNull(),
		reason: text('reason'),
		note: text('note').notNull().default(''),
		recordedBy: text('recorded_by').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [
		index('payments_job_idx').on(t.jobId, t.receivedOn),
		uniqueIndex('payments_reference_idx').on(t.jobId, t.method, t.reference),
		check(
			'payments_refund_sign',
			sql`(${t.kind} = 'refund' and ${t.amountCents} < 0 and ${t.reason} is not null) or (${t.kind} <> 'refund' and ${t.amountCents} > 0)`
		)
	]
);

/** Webhook events already handled (the unique id makes a replay a no-op). */
export const paymentEvents = pgTable('payment_events', {
	eventId: text('event_id').primaryKey(),
	type: text('type').notNull(),
	providerSessionId: text('provider_session_id'),
	/** recorded, duplicate_checkout, unknown_checkout, amount_mismatch, expired, ignored */
	outcome: text('outcome').notNull(),
	receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow()
});

/** The homeowner's private link to pay and read invoices (only the SHA-256 of the token is kept). */
export const payLinks = pgTable(
	'pay_links',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull().unique(),
		createdAt: createdAt()
	},
	(t) => [index('pay_links_job_idx').on(t.jobId)]
);

/** One row: the last invoice number issued, bumped in the transaction that inserts the invoice. */
export const invoiceCounter = pgTable('invoice_counter', {
	id: integer('id').primaryKey().default(1),
	last: integer('last').notNull().default(0)
});

export interface InvoiceLine {
	description: string;
	amountCents: number;
}

export interface InvoiceSnapshot {
	firm: { name: string; email: string; phone: string; address: string };
	billTo: { name: string; email: string | null; address: string };
	jobNumber: number;
	title: string;
	lines: InvoiceLine[];
	payments: { receivedOn: string; method: string; reference: string | null; amountCents: number }[];
}

export const invoices = pgTable(
	'invoices',
	{
		id: text('id').primaryKey(),
		number: integer('number').notNull().unique(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		kind: invoiceKindEnum('kind').notNull(),
		snapshot: jsonb('snapshot').$type<InvoiceSnapshot>().notNull(),
		totalCents: integer('total_cents').notNull(),
		taxCents: integer('tax_cents').notNull(),
		paymentsCents: integer('payments_cents').notNull(),
		balanceDueCents: integer('balance_due_cents').notNull(),
		issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
		dueOn: date('due_on').notNull(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('invoices_job_kind_idx').on(t.jobId, t.kind)]
);

export type Payment = typeof payments.$inferSelect;
export type CheckoutRequestRow = typeof checkoutRequests.$inferSelect;
export type Invoice = typeof invoices.$inferSelect;

// Seasonal care, service visits and calendar feeds live in their own file.
export * from './care-schema';
// Job costing (time, materials, other costs, learned labor rates) lives in its own file.
export * from './costing-schema';
// Suppliers and purchase orders live in their own file.
export * from './purchasing-schema';
// Warranty callbacks live in their own file.
export * from './callbacks-schema';
