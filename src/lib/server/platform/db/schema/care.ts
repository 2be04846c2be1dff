// Seasonal care as a business: features on record for any property, care plans and the
// homeowners' subscriptions, service visits planned into crew days, their parts and photos,
// the homeowner links and card checkouts of care, and each staff member's calendar feed.
import { sql } from 'drizzle-orm';
import {
	boolean,
	date,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import type { PlanVisit, PriceTable } from '../../../../care/kinds';
import { users } from './auth';
import { createdAt, updatedAt } from './columns';
import { contacts, properties } from './leads';
import { photos } from './photos';

/** A feature on record at a property: from a job the firm completed, or added by hand. */
export const propertyFeatures = pgTable(
	'property_features',
	{
		id: text('id').primaryKey(),
		propertyId: text('property_id')
			.notNull()
			.references(() => properties.id, { onDelete: 'cascade' }),
		/** The completed job it came from (null for work of other firms). */
		jobId: text('job_id'),
		kind: text('kind').notNull(),
		size: text('size').notNull(),
		pump: text('pump').notNull().default(''),
		lights: integer('lights').notNull().default(0),
		notes: text('notes').notNull().default(''),
		builtBy: text('built_by').notNull().default('us'),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		index('property_features_property_idx').on(t.propertyId),
		uniqueIndex('property_features_job_kind_idx').on(t.jobId, t.kind)
	]
);

export const featurePhotos = pgTable(
	'feature_photos',
	{
		featureId: text('feature_id')
			.notNull()
			.references(() => propertyFeatures.id, { onDelete: 'cascade' }),
		photoId: text('photo_id')
			.notNull()
			.references(() => photos.id, { onDelete: 'cascade' })
	},
	(t) => [primaryKey({ columns: [t.featureId, t.photoId] })]
);

/** Where a property is: a pin placed by staff, or the centre of its postal code. */
export const propertyLocations = pgTable('property_locations', {
	propertyId: text('property_id')
		.primaryKey()
		.references(() => properties.id, { onDelete: 'cascade' }),
	lat: doublePrecision('lat').notNull(),
	lng: doublePrecision('lng').notNull(),
	source: text('source').notNull(),
	updatedAt: updatedAt()
});

export const carePlans = pgTable('care_plans', {
	id: text('id').primaryKey(),
	name: text('name').notNull(),
	summary: text('summary').notNull().default(''),
	terms: text('terms').notNull().default(''),
	visits: jsonb('visits').$type<PlanVisit[]>().notNull(),
	prices: jsonb('prices').$type<PriceTable>().notNull(),
	payYearly: boolean('pay_yearly').notNull().default(true),
	payPerVisit: boolean('pay_per_visit').notNull().default(true),
	active: boolean('active').notNull().default(true),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** One homeowner's plan for one property; at most one that is not cancelled per property. */
export const careSubscriptions = pgTable(
	'care_subscriptions',
	{
		id: text('id').primaryKey(),
		planId: text('plan_id')
			.notNull()
			.references(() => carePlans.id),
		propertyId: text('property_id')
			.notNull()
			.references(() => properties.id, { onDelete: 'cascade' }),
		contactId: text('contact_id')
			.notNull()
			.references(() => contacts.id),
		/** 'year': paid by card for the year ahead; 'visit': invoiced after each visit. */
		billing: text('billing').notNull(),
		/** pending (waiting for the card payment), active, cancelled */
		status: text('status').notNull().default('pending'),
		featureIds: text('feature_ids').array().notNull(),
		yearCents: integer('year_cents').notNull(),
		typedName: text('typed_name').notNull(),
		acceptedAt: timestamp('accepted_at', { withTimezone: true }).notNull(),
		ipAddress: text('ip_address'),
		startsOn: date('starts_on').notNull(),
		renewsOn: date('renews_on').notNull(),
		/** For yearly billing: the last day the card payments cover. */
		paidThrough: date('paid_through'),
		cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		uniqueIndex('care_subscriptions_one_per_property_idx')
			.on(t.propertyId)
			.where(sql`${t.status} <> 'cancelled'`)
	]
);

/** One row: the season windows, the yard the crews start from, and travel speed. */
export const careSeasonSettings = pgTable('care_season_settings', {
	id: integer('id').primaryKey().default(1),
	firstFrost: text('first_frost').notNull().default('10-15'),
	shutdownDays: integer('shutdown_days').notNull().default(42),
	springStart: text('spring_start').notNull().default('04-15'),
	springDays: integer('spring_days').notNull().default(45),
	summerStart: text('summer_start').notNull().default('06-15'),
	summerDays: integer('summer_days').notNull().default(60),
	depotLat: doublePrecision('depot_lat'),
	depotLng: doublePrecision('depot_lng'),
	speedKmh: integer('speed_kmh').notNull().default(40),
	updatedAt: updatedAt()
});

/** A day a crew lead is free for service visits, with their hours (minutes after midnight). */
export const careCrewDays = pgTable(
	'care_crew_days',
	{
		id: text('id').primaryKey(),
		day: date('day').notNull(),
		crewLeadId: text('crew_lead_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		startMinute: integer('start_minute').notNull(),
		endMinute: integer('end_minute').notNull(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('care_crew_days_day_lead_idx').on(t.day, t.crewLeadId)]
);

export interface ChecklistItem {
	item: string;
	done: boolean;
}

/** One visit of one kind to one feature in one season: unique, so generating twice adds nothing. */
export const serviceVisits = pgTable(
	'service_visits',
	{
		id: text('id').primaryKey(),
		subscriptionId: text('subscription_id')
			.notNull()
			.references(() => careSubscriptions.id, { onDelete: 'cascade' }),
		featureId: text('feature_id')
			.notNull()
			.references(() => propertyFeatures.id, { onDelete: 'cascade' }),
		propertyId: text('property_id')
			.notNull()
			.references(() => properties.id, { onDelete: 'cascade' }),
		kind: text('kind').notNull(),
		/** "autumn-2027" */
		season: text('season').notNull(),
		windowStart: date('window_start').notNull(),
		windowEnd: date('window_end').notNull(),
		/** due, dated, done, cancelled */
		status: text('status').notNull().default('due'),
		day: date('day'),
		crewDayId: text('crew_day_id').references(() => careCrewDays.id, { onDelete: 'set null' }),
		crewLeadId: text('crew_lead_id').references(() => users.id),
		routeOrder: integer('route_order'),
		minutes: integer('minutes').notNull(),
		priceCents: integer('price_cents').notNull(),
		billedPerVisit: boolean('billed_per_visit').notNull(),
		checklist: jsonb('checklist').$type<ChecklistItem[]>().notNull(),
		notes: text('notes').notNull().default(''),
		/** The day the homeowner was last told (a move to another day tells them again). */
		notifiedDay: date('notified_day'),
		changeRequest: text('change_request'),
		changeRequestedAt: timestamp('change_requested_at', { withTimezone: true }),
		doneAt: timestamp('done_at', { withTimezone: true }),
		doneBy: text('done_by').references(() => users.id),
		paidAt: timestamp('paid_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		uniqueIndex('service_visits_once_idx').on(t.subscriptionId, t.featureId, t.kind, t.season),
		index('service_visits_day_idx').on(t.day, t.crewLeadId),
		index('service_visits_season_idx').on(t.season, t.status)
	]
);

/** Parts from the price list used on a visit: added to the visit's invoice at list price. */
export const serviceVisitParts = pgTable(
	'service_visit_parts',
	{
		id: text('id').primaryKey(),
		serviceVisitId: text('service_visit_id')
			.notNull()
			.references(() => serviceVisits.id, { onDelete: 'cascade' }),
		sku: text('sku').notNull(),
		name: text('name').notNull(),
		unit: text('unit').notNull(),
		quantity: doublePrecision('quantity').notNull(),
		unitPriceCents: integer('unit_price_cents').notNull(),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt()
	},
	(t) => [index('service_visit_parts_visit_idx').on(t.serviceVisitId)]
);

export const serviceVisitPhotos = pgTable(
	'service_visit_photos',
	{
		serviceVisitId: text('service_visit_id')
			.notNull()
			.references(() => serviceVisits.id, { onDelete: 'cascade' }),
		photoId: text('photo_id')
			.notNull()
			.references(() => photos.id, { onDelete: 'cascade' })
	},
	(t) => [primaryKey({ columns: [t.serviceVisitId, t.photoId] })]
);

/** The homeowner's private links (only the SHA-256 kept): a property's care page, or one visit. */
export const careLinks = pgTable(
	'care_links',
	{
		tokenHash: text('token_hash').primaryKey(),
		propertyId: text('property_id')
			.notNull()
			.references(() => properties.id, { onDelete: 'cascade' }),
		serviceVisitId: text('service_visit_id').references(() => serviceVisits.id, {
			onDelete: 'cascade'
		}),
		createdAt: createdAt()
	},
	(t) => [index('care_links_property_idx').on(t.propertyId)]
);

/** A card checkout asked of the provider for a year of care or one visit's invoice. */
export const careCheckouts = pgTable('care_checkouts', {
	id: text('id').primaryKey(),
	subscriptionId: text('subscription_id').references(() => careSubscriptions.id, {
		onDelete: 'cascade'
	}),
	serviceVisitId: text('service_visit_id').references(() => serviceVisits.id, {
		onDelete: 'cascade'
	}),
	/** For a year: the last day this payment covers. */
	coversThrough: date('covers_through'),
	amountCents: integer('amount_cents').notNull(),
	currency: text('currency').notNull(),
	providerSessionId: text('provider_session_id').notNull().unique(),
	url: text('url').notNull(),
	status: text('status').notNull().default('open'),
	problem: text('problem'),
	paidAt: timestamp('paid_at', { withTimezone: true }),
	createdAt: createdAt()
});

/** A staff member's private calendar subscription (only the SHA-256 of the token kept). */
export const calendarFeeds = pgTable('calendar_feeds', {
	userId: text('user_id')
		.primaryKey()
		.references(() => users.id, { onDelete: 'cascade' }),
	tokenHash: text('token_hash').notNull().unique(),
	createdAt: createdAt()
});

export type PropertyFeature = typeof propertyFeatures.$inferSelect;
export type CarePlan = typeof carePlans.$inferSelect;
export type CareSubscription = typeof careSubscriptions.$inferSelect;
export type ServiceVisit = typeof serviceVisits.$inferSelect;
export type CareCrewDay = typeof careCrewDays.$inferSelect;
