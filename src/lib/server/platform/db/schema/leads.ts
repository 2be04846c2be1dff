// People, places and leads, and each lead's timeline.
import { sql } from 'drizzle-orm';
import {
	type AnyPgColumn,
	boolean,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { CLOSE_REASONS, LEAD_STAGES } from '../../../../stages';
import { createdAt, updatedAt } from './columns';
import { users } from './auth';

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

export const leadStageEnum = pgEnum('lead_stage', LEAD_STAGES);
export type LeadStage = (typeof leadStageEnum.enumValues)[number];

export const closeReasonEnum = pgEnum('close_reason', CLOSE_REASONS);
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

export type Contact = typeof contacts.$inferSelect;
export type Lead = typeof leads.$inferSelect;
export type Activity = typeof activities.$inferSelect;
