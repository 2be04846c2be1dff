// Site visits: availability, time off, booked visits (no overlaps, enforced by the database with a
// btree_gist exclusion constraint; see drizzle/*_visits_exclusion.sql).
import { sql } from 'drizzle-orm';
import {
	customType,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './columns';
import { users } from './auth';
import { leads } from './leads';

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
