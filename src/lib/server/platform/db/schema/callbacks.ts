// Warranty callbacks: the homeowner's private link to report a problem with finished work (in
// the completion mail), the callbacks themselves (inside or outside the warranty period as it
// stood when reported), their photos (the inquiry's photo pipeline), assignment, day and notes.
import { boolean, date, index, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { jobs } from './jobs';
import { photos } from './photos';
import { createdAt, updatedAt } from './columns';
import { CALLBACK_STATUSES } from '../../../../stages';

/** One link per job (only the SHA-256 of its token is kept); it does not expire. */
export const callbackLinks = pgTable('callback_links', {
	jobId: text('job_id')
		.primaryKey()
		.references(() => jobs.id, { onDelete: 'cascade' }),
	tokenHash: text('token_hash').notNull().unique(),
	createdAt: createdAt()
});

export const callbacks = pgTable(
	'callbacks',
	{
		id: text('id').primaryKey(),
		jobId: text('job_id')
			.notNull()
			.references(() => jobs.id, { onDelete: 'cascade' }),
		description: text('description').notNull(),
		status: text('status', { enum: CALLBACK_STATUSES }).notNull().default('reported'),
		/** Fixed when reported, from the completion day and the warranty setting of that moment. */
		inWarranty: boolean('in_warranty').notNull(),
		warrantyEndsOn: date('warranty_ends_on'),
		reportedOn: date('reported_on').notNull(),
		assignedTo: text('assigned_to').references(() => users.id),
		scheduledOn: date('scheduled_on'),
		closingNotes: text('closing_notes').notNull().default(''),
		closedAt: timestamp('closed_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [
		index('callbacks_job_idx').on(t.jobId),
		index('callbacks_status_idx').on(t.status, t.scheduledOn)
	]
);

export const callbackPhotos = pgTable(
	'callback_photos',
	{
		callbackId: text('callback_id')
			.notNull()
			.references(() => callbacks.id, { onDelete: 'cascade' }),
		photoId: text('photo_id')
			.notNull()
			.references(() => photos.id, { onDelete: 'cascade' })
	},
	(t) => [primaryKey({ columns: [t.callbackId, t.photoId] })]
);

export type Callback = typeof callbacks.$inferSelect;
