import { index, integer, jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { createdAt } from './columns';
import { leads } from './leads';

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
