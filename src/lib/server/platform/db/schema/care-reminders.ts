// Seasonal care reminders of completed jobs (autumn shut-down, spring start-up).
import { boolean, integer, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './columns';
import { jobs } from './jobs';

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

export type CareSettings = typeof careSettings.$inferSelect;
