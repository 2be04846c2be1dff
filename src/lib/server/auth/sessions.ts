// Sessions through lucia 3 and its Drizzle adapter; everything else imports from here,
// so the session library can be swapped without touching routes.
import { Lucia, TimeSpan } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq } from 'drizzle-orm';
import { client, db } from '../platform/db';
import { sessions, users, type Role } from '../platform/db/schema';
import { newToken, sha256 } from '../platform/crypto';
import { origin } from '../platform/env';

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

type ValidSession = { user: SessionUser; session: SessionInfo };

/**
 * Sessions validated in the last few seconds, by session id. The office table fetches page after
 * page, and a database round trip per request for the same cookie doubled its cost. Every way a
 * session ends in this app (sign-out, sign-in over it, role change, disabling, password reset)
 * goes through endSession/endAllSessionsOf/forgetSessionsOf below, which drop the entries here
 * and tell every other app process through PostgreSQL (NOTIFY on SESSION_CHANNEL; each process
 * LISTENs). A process caches nothing until its LISTEN first succeeds. postgres.js gives no sign
 * when that connection drops: it reconnects, and the cache is emptied then (onlisten below), but
 * a session ended elsewhere while it was down may be trusted here for up to the cache lifetime.
 */
/** How long a validated session is trusted without asking the database: 5 s, or SESSION_CACHE_MS. */
const SESSION_CACHE_MS = cacheLifetime(process.env.SESSION_CACHE_MS);

function cacheLifetime(setting: string | undefined): number {
	const ms = Number(setting);
	return setting && Number.isInteger(ms) && ms >= 0 ? ms : 5_000;
}
const SESSION_CACHE_MAX = 5_000;
const SESSION_CHANNEL = 'rillstone_sessions';
const recentSessions = new Map<string, { until: number; value: ValidSession }>();

type Forget = { sessionId: string } | { userId: string };
let listening = false;
let listenStarted = false;

function dropLocally(what: Forget) {
	if ('sessionId' in what) recentSessions.delete(what.sessionId);
	else {
		for (const [id, entry] of recentSessions) {
			if (entry.value.user.id === what.userId) recentSessions.delete(id);
		}
	}
}

/** Subscribes this process to the other processes' session ends (once; postgres.js reconnects). */
function listenForForgets() {
	if (listenStarted) return;
	listenStarted = true;
	client
		.listen(
			SESSION_CHANNEL,
			(payload) => {
				try {
					dropLocally(JSON.parse(payload) as Forget);
				} catch {
					recentSessions.clear();
				}
			},
			() => {
				// (Re)connected: anything cached before may have missed a message.
				recentSessions.clear();
				listening = true;
			}
		)
		.catch((error: Error) => {
			listening = false;
			listenStarted = false;
			console.error('[sessions] not listening for session ends; caching off:', error.message);
		});
}

/** Drops the entries here and in every other process. */
async function forget(what: Forget): Promise<void> {
	dropLocally(what);
	await client.notify(SESSION_CHANNEL, JSON.stringify(what));
}

function remember(id: string, value: ValidSession) {
	if (!listening) return;
	if (recentSessions.size >= SESSION_CACHE_MAX) {
		recentSessions.delete(recentSessions.keys().next().value!); // the oldest entry
	}
	const until = Math.min(Date.now() + SESSION_CACHE_MS, value.session.absoluteExpiresAt.getTime());
	recentSessions.set(id, {
		until,
		value: { ...value, session: { ...value.session, fresh: false } }
	});
}

/** Drops a user's cached sessions in every process, so a change to them shows on the next request. */
export async function forgetSessionsOf(userId: string): Promise<void> {
	await forget({ userId });
}

export async function validateSessionToken(token: string): Promise<ValidSession | null> {
	listenForForgets();
	const id = sha256(token);
	const cached = recentSessions.get(id);
	if (cached && cached.until > Date.now()) return cached.value;
	recentSessions.delete(id);
	const { session, user } = await lucia.validateSession(id);
	if (!session || !user) return null;
	if (user.disabledAt || session.absoluteExpiresAt.getTime() <= Date.now()) {
		await lucia.invalidateSession(id);
		return null;
	}
	const valid: ValidSession = {
		user: { id: user.id, email: user.email, name: user.name, role: user.role },
		session: {
			id,
			expiresAt: session.expiresAt,
			absoluteExpiresAt: session.absoluteExpiresAt,
			fresh: session.fresh
		}
	};
	remember(id, valid);
	return valid;
}

export function blankSessionCookie() {
	return lucia.createBlankSessionCookie();
}

export function cookieForToken(token: string) {
	return lucia.createSessionCookie(token);
}

export async function endSession(sessionId: string): Promise<void> {
	await lucia.invalidateSession(sessionId);
	await forget({ sessionId });
}

export async function endAllSessionsOf(userId: string): Promise<void> {
	await lucia.invalidateUserSessions(userId);
	await forget({ userId });
}

export async function findUserByEmail(email: string) {
	const [row] = await db
		.select()
		.from(users)
		.where(eq(users.email, email.trim().toLowerCase()))
		.limit(1);
	return row ?? null;
}
