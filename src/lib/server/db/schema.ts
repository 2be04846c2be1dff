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

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();
const updatedAt = () =>
	timestamp('updated_at', { withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date());

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

export type User = typeof users.$inferSelect;
export type Settings = typeof settings.$inferSelect;
