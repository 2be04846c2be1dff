// Staff accounts and what signing in keeps: sessions, invitations, password resets and the
// sign-in throttle.
import { sql } from 'drizzle-orm';
import {
	boolean,
	index,
	integer,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { createdAt, updatedAt } from './columns';

export const roleEnum = pgEnum('role', ['owner', 'sales', 'crew']);
export type Role = (typeof roleEnum.enumValues)[number];

export const users = pgTable(
	'users',
	{
		id: text('id').primaryKey(),
		email: text('email').notNull(),
		name: text('name').notNull(),
		role: roleEnum('role').notNull(),
		passwordHash: text('password_hash').notNull(),
		phone: text('phone'),
		disabledAt: timestamp('disabled_at', { withTimezone: true }),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [uniqueIndex('users_email_idx').on(sql`lower(${t.email})`)]
);

/** The staff member who did something (created, recorded, confirmed); kept if the user goes. */
export const byUser = (name: string) => text(name).references(() => users.id);

// The session id is the SHA-256 of the token in the cookie: a leaked table opens no session.
export const sessions = pgTable(
	'sessions',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		absoluteExpiresAt: timestamp('absolute_expires_at', { withTimezone: true }).notNull(),
		ipAddress: text('ip_address'),
		userAgent: text('user_agent'),
		createdAt: createdAt()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const invitations = pgTable('invitations', {
	id: text('id').primaryKey(),
	tokenHash: text('token_hash').notNull().unique(),
	email: text('email').notNull(),
	name: text('name').notNull(),
	role: roleEnum('role').notNull(),
	invitedBy: text('invited_by')
		.notNull()
		.references(() => users.id),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	acceptedAt: timestamp('accepted_at', { withTimezone: true }),
	revokedAt: timestamp('revoked_at', { withTimezone: true }),
	createdAt: createdAt()
});

export const passwordResets = pgTable('password_resets', {
	id: text('id').primaryKey(),
	tokenHash: text('token_hash').notNull().unique(),
	userId: text('user_id')
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
	usedAt: timestamp('used_at', { withTimezone: true }),
	createdAt: createdAt()
});

// Failed sign-ins, kept in the database so several app processes share the throttle.
export const signInAttempts = pgTable(
	'sign_in_attempts',
	{
		id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
		emailKey: text('email_key').notNull(),
		ipAddress: text('ip_address').notNull(),
		succeeded: boolean('succeeded').notNull(),
		createdAt: createdAt()
	},
	(t) => [
		index('sign_in_attempts_email_idx').on(t.emailKey, t.createdAt),
		index('sign_in_attempts_ip_idx').on(t.ipAddress, t.createdAt)
	]
);

/**
 * Failed sign-ins counted per key: `account:<email>` and `address:<ip>` for devices that have not
 * signed in before, `device:<nonce>` for a known device. The delay grows from the count and the
 * time of the last failure; a count whose last failure is a day old starts again.
 */
export const signInThrottles = pgTable('sign_in_throttles', {
	key: text('key').primaryKey(),
	failures: integer('failures').notNull().default(0),
	lastFailureAt: timestamp('last_failure_at', { withTimezone: true }).notNull()
});

export type User = typeof users.$inferSelect;
