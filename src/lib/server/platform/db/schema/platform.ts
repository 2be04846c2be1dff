// Firm-wide rows: the firm's settings and the request counters every app process shares.
import { integer, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './columns';

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

export type Settings = typeof settings.$inferSelect;
