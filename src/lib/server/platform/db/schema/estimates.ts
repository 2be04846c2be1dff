// The price list, pump models, labor rates, engine settings, estimates (versioned per lead) and
// the homeowner's acceptance (one per estimate).
import { sql } from 'drizzle-orm';
import {
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
import { ESTIMATE_STATUSES } from '../../../../stages';
import { createdAt, updatedAt } from './columns';
import { users } from './auth';
import { leads } from './leads';

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

export const estimateStatusEnum = pgEnum('estimate_status', ESTIMATE_STATUSES);
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
