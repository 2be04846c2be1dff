// Column shapes the schema files share, so each table reads as what it holds.
import { timestamp } from 'drizzle-orm/pg-core';

export const createdAt = () =>
	timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
export const updatedAt = () =>
	timestamp('updated_at', { withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date());
/** A moment that may not have happened yet (sent, received, started): nullable timestamptz. */
export const at = (name: string) => timestamp(name, { withTimezone: true });
