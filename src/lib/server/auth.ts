// Sessions through lucia 3 and its Drizzle adapter; everything else imports from here,
// so the session library can be swapped without touching routes.
import { Lucia, TimeSpan } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq } from 'drizzle-orm';
import { db } from './db';
import { sessions, users, type Role } from './db/schema';
import { newToken, sha256 } from './crypto';
import { origin } from './env';

/** Idle expiry: lucia extends a session used in the second half of this span. */
export const IDLE_LIFETIME = new TimeSpan(4, 'h');
/** Staff sign in each working day: no session outlives this, however active. */
export const ABSOLUTE_LIFETIME_MS = 12 * 60 * 60 * 1000;

const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);

export const lucia = new Lucia(adapter, {
	sessionExpiresIn: IDLE_LIFETIME,
	sessionCookie: {
		name: 'rs_session',
		expires: false,
		attributes: {
			secure: origin().startsWith('https:') || process.env.COOKIE_SECURE === 'true',
			sameSite: 'lax'
		}
	},
	getSessionAttributes: (attributes) => ({ absoluteExpiresAt: attributes.absoluteExpiresAt }),
	getUserAttributes: (attributes) => ({
		email: attributes.email,
		name: attributes.name,
		role: attributes.role,
		disabledAt: attributes.disabledAt
	})
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseSessionAttributes: {
			absoluteExpiresAt: Date;
			ipAddress: string | null;
			userAgent: string | null;
		};
		DatabaseUserAttributes: { email: string; name: string; role: Role; disabledAt: Date | null };
	}
}

export interface SessionUser {
	id: string;
	email: string;
	name: string;
	role: Role;
}
export interface SessionInfo {
	id: string;
	expiresAt: Date;
	absoluteExpiresAt: Date;
	fresh: boolean;
}

export const sessionCookieName = lucia.sessionCookieName;

/** A new session; the cookie carries the token, the database only its hash. */
export async function createSession(
	userId: string,
	meta: { ipAddress?: string; userAgent?: string } = {}
): Promise<{ token: string; cookie: ReturnType<typeof lucia.createSessionCookie> }> {
	const token = newToken();
	await lucia.createSession(
		userId,
		{
			absoluteExpiresAt: new Date(Date.now() + ABSOLUTE_LIFETIME_MS),
			ipAddress: meta.ipAddress ?? null,
			userAgent: meta.userAgent?.slice(0, 300) ?? null
		},
		{ sessionId: sha256(token) }
	);
	return { token, cookie: lucia.createSessionCookie(token) };
}

export async function validateSessionToken(
	token: string
): Promise<{ user: SessionUser; session: SessionInfo } | null> {
	const id = sha256(token);
	const { session, user } = await lucia.validateSession(id);
	if (!session || !user) return null;
	if (user.disabledAt || session.absoluteExpiresAt.getTime() <= Date.now()) {
		await lucia.invalidateSession(id);
		return null;
	}
	return {
		user: { id: user.id, email: user.email, name: user.name, role: user.role },
		session: {
			id,
			expiresAt: session.expiresAt,
			absoluteExpiresAt: session.absoluteExpiresAt,
			fresh: session.fresh
		}
	};
}

export function blankSessionCookie() {
	return lucia.createBlankSessionCookie();
}

export function cookieForToken(token: string) {
	return lucia.createSessionCookie(token);
}

export async function endSession(sessionId: string): Promise<void> {
	await lucia.invalidateSession(sessionId);
}

export async function endAllSessionsOf(userId: string): Promise<void> {
	await lucia.invalidateUserSessions(userId);
}

export async function findUserByEmail(email: string) {
	const [row] = await db
		.select()
		.from(users)
		.where(eq(users.email, email.trim().toLowerCase()))
		.limit(1);
	return row ?? null;
}
