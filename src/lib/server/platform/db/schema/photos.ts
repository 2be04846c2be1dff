import { index, integer, pgTable, text } from 'drizzle-orm/pg-core';
import { createdAt } from './columns';
import { users } from './auth';
import { leads } from './leads';
import { siteVisits } from './visits';
import { jobs } from './jobs';

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

export type Photo = typeof photos.$inferSelect;
