// Staff accounts: invitations, roles, disabling, password resets.
import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import { invitations, passwordResets, users, type Role } from '../platform/db/schema';
import { newId, newToken, sha256 } from '../platform/crypto';
import { hashPassword } from './passwords';
import { endAllSessionsOf, forgetSessionsOf } from './sessions';
import { htmlBody, sendMail } from '../platform/mail';
import { dispatchMail, writeMail } from '../platform/outbox';
import { accountKey, clearThrottle } from './throttle';
import { origin } from '../platform/env';
import { firmSettings } from '../platform/settings';

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;
export const RESET_LIFETIME_MS = 60 * 60 * 1000;

export class TeamError extends Error {}

export function listMembers() {
	return db
		.select({
			id: users.id,
			name: users.name,
			email: users.email,
			role: users.role,
			disabledAt: users.disabledAt,
			createdAt: users.createdAt
		})
		.from(users)
		.orderBy(asc(users.name));
}

export function pendingInvitations() {
	return db
		.select({
			id: invitations.id,
			name: invitations.name,
			email: invitations.email,
			role: invitations.role,
			expiresAt: invitations.expiresAt
		})
		.from(invitations)
		.where(
			and(
				isNull(invitations.acceptedAt),
				isNull(invitations.revokedAt),
				gt(invitations.expiresAt, new Date())
			)
		)
		.orderBy(asc(invitations.createdAt));
}

export async function createUser(input: {
	email: string;
	name: string;
	role: Role;
	password: string;
}) {
	const id = newId();
	await db.insert(users).values({
		id,
		email: input.email.trim().toLowerCase(),
		name: input.name.trim(),
		role: input.role,
		passwordHash: await hashPassword(input.password)
	});
	return id;
}

export async function invite(
	invitedBy: string,
	input: { email: string; name: string; role: Role }
): Promise<void> {
	const [existing] = await db
		.select({ id: users.id })
		.from(users)
		.where(eq(users.email, input.email))
		.limit(1);
	if (existing) throw new TeamError('Someone on the team already uses that e-mail address');
	const token = newToken();
	await db
		.update(invitations)
		.set({ revokedAt: new Date() })
		.where(
			and(
				eq(invitations.email, input.email),
				isNull(invitations.acceptedAt),
				isNull(invitations.revokedAt)
			)
		);
	await db.insert(invitations).values({
		id: newId(),
		tokenHash: sha256(token),
		email: input.email,
		name: input.name,
		role: input.role,
		invitedBy,
		expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS)
	});
	const firm = await firmSettings();
	const url = `${origin()}/invitation/${token}`;
	const lines = [
		`Hello ${input.name},`,
		`${firm.firmName} has invited you to its office on Rillstone as ${roleLabel(input.role)}.`,
		'Choose a password to join. The link works once and expires in 7 days.'
	];
	await sendMail({
		to: input.email,
		subject: `Join ${firm.firmName} on Rillstone`,
		text: `${lines.join('\n\n')}\n\n${url}\n\n${firm.firmName} · ${firm.phone}`,
		html: htmlBody(lines, { label: 'Choose a password', url }, `${firm.firmName} · ${firm.phone}`)
	});
}

export function roleLabel(role: Role): string {
	return { owner: 'owner', sales: 'salesperson', crew: 'crew lead' }[role];
}

export async function findOpenInvitation(token: string) {
	const [row] = await db
		.select()
		.from(invitations)
		.where(
			and(
				eq(invitations.tokenHash, sha256(token)),
				isNull(invitations.acceptedAt),
				isNull(invitations.revokedAt),
				gt(invitations.expiresAt, new Date())
			)
		)
		.limit(1);
	return row ?? null;
}

/** Accepts an invitation exactly once; returns the new user's id, or null when the link is spent. */
export async function acceptInvitation(token: string, password: string): Promise<string | null> {
	const passwordHash = await hashPassword(password);
	return db.transaction(async (tx) => {
		const [invitation] = await tx
			.update(invitations)
			.set({ acceptedAt: new Date() })
			.where(
				and(
					eq(invitations.tokenHash, sha256(token)),
					isNull(invitations.acceptedAt),
					isNull(invitations.revokedAt),
					gt(invitations.expiresAt, new Date())
				)
			)
			.returning();
		if (!invitation) return null;
		const id = newId();
		await tx.insert(users).values({
			id,
			email: invitation.email,
			name: invitation.name,
			role: invitation.role,
			passwordHash
		});
		return id;
	});
}

async function ownersLeft(exceptUserId: string): Promise<number> {
	const [row] = await db
		.select({ n: sql<number>`count(*)::int` })
		.from(users)
		.where(
			and(eq(users.role, 'owner'), isNull(users.disabledAt), sql`${users.id} <> ${exceptUserId}`)
		);
	return row.n;
}

export async function changeRole(actorId: string, userId: string, role: Role): Promise<void> {
	if (role !== 'owner' && (await ownersLeft(userId)) === 0) {
		throw new TeamError('The firm needs at least one active owner');
	}
	const updated = await db
		.update(users)
		.set({ role })
		.where(eq(users.id, userId))
		.returning({ id: users.id });
	if (!updated.length) throw new TeamError('No such team member');
	// A role change takes effect at once: the member signs in again with the new role.
	if (actorId !== userId) await endAllSessionsOf(userId);
	else await forgetSessionsOf(userId);
}

export async function setDisabled(
	actorId: string,
	userId: string,
	disabled: boolean
): Promise<void> {
	if (actorId === userId && disabled) throw new TeamError('You cannot disable your own account');
	if (disabled && (await ownersLeft(userId)) === 0) {
		throw new TeamError('The firm needs at least one active owner');
	}
	const updated = await db
		.update(users)
		.set({ disabledAt: disabled ? new Date() : null })
		.where(eq(users.id, userId))
		.returning({ id: users.id });
	if (!updated.length) throw new TeamError('No such team member');
	if (disabled) await endAllSessionsOf(userId);
}

/** At most one reset mail per account in this span, however often /forgot is asked. */
export const RESET_MAIL_INTERVAL_MS = 5 * 60 * 1000;

/**
 * Writes a reset link and its mail to the outbox, unless the account does not exist, is disabled
 * or had a link mailed in the last five minutes. The caller answers the same in every case.
 */
export async function requestPasswordReset(email: string): Promise<void> {
	const firm = await firmSettings();
	const outboxId = await db.transaction(async (tx) => {
		// The user row is locked, so two requests at once cannot both pass the interval check.
		const [user] = await tx
			.select()
			.from(users)
			.where(eq(users.email, email.trim().toLowerCase()))
			.limit(1)
			.for('update');
		if (!user || user.disabledAt) return null;
		const [recent] = await tx
			.select({ id: passwordResets.id })
			.from(passwordResets)
			.where(
				and(
					eq(passwordResets.userId, user.id),
					gt(passwordResets.createdAt, new Date(Date.now() - RESET_MAIL_INTERVAL_MS))
				)
			)
			.limit(1);
		if (recent) return null;
		const token = newToken();
		const resetId = newId();
		await tx.insert(passwordResets).values({
			id: resetId,
			tokenHash: sha256(token),
			userId: user.id,
			expiresAt: new Date(Date.now() + RESET_LIFETIME_MS)
		});
		const url = `${origin()}/reset/${token}`;
		const lines = [
			`Hello ${user.name},`,
			'Someone asked to reset the password of your Rillstone account. If it was you, choose a new password with the link below; it works once, for one hour.',
			'If it was not you, ignore this message: your password stays as it is.'
		];
		return writeMail(
			{
				dedupeKey: `password-reset:${resetId}`,
				to: user.email,
				subject: 'Reset your Rillstone password',
				text: `${lines.join('\n\n')}\n\n${url}`,
				html: htmlBody(lines, { label: 'Choose a new password', url }, firm.firmName)
			},
			tx
		);
	});
	if (outboxId) await dispatchMail(outboxId);
}

export async function findOpenReset(token: string) {
	const [row] = await db
		.select()
		.from(passwordResets)
		.where(
			and(
				eq(passwordResets.tokenHash, sha256(token)),
				isNull(passwordResets.usedAt),
				gt(passwordResets.expiresAt, new Date())
			)
		)
		.limit(1);
	return row ?? null;
}

/** Sets the new password once per link and ends every session of the account. */
export async function completePasswordReset(token: string, password: string): Promise<boolean> {
	const passwordHash = await hashPassword(password);
	const userId = await db.transaction(async (tx) => {
		const [reset] = await tx
			.update(passwordResets)
			.set({ usedAt: new Date() })
			.where(
				and(
					eq(passwordResets.tokenHash, sha256(token)),
					isNull(passwordResets.usedAt),
					gt(passwordResets.expiresAt, new Date())
				)
			)
			.returning();
		if (!reset) return null;
		await tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId));
		return reset.userId;
	});
	if (!userId) return false;
	await endAllSessionsOf(userId);
	// Whoever completes a reset holds the mailbox: the account's sign-in delays end with it.
	const [user] = await db.select({ email: users.email }).from(users).where(eq(users.id, userId));
	if (user) await clearThrottle([accountKey(user.email)]);
	return true;
}
