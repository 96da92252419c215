// Sessions: create, validate and end them, and the cookie that carries the token.
import type { Session, User } from 'lucia';
import { lucia, SESSION_ABSOLUTE_TIMEOUT_S } from './lucia';
import { hashToken, randomToken } from './crypto';

export type SessionUser = User;
export type UserSession = Session;

export const SESSION_COOKIE = lucia.sessionCookieName;

export type CookieSpec = {
	name: string;
	value: string;
	attributes: Record<string, unknown> & { path?: string };
};

function cookieSpec(value: string, blank = false): CookieSpec {
	const cookie = blank ? lucia.createBlankSessionCookie() : lucia.createSessionCookie(value);
	return {
		name: cookie.name,
		value: cookie.value,
		attributes: { ...cookie.attributes, path: '/' }
	};
}

/** A new session at every sign-in: 160-bit token in the cookie, its hash in the database. */
export async function createUserSession(userId: string) {
	const token = randomToken(20);
	const session = await lucia.createSession(
		userId,
		{ issuedAt: Math.floor(Date.now() / 1000) },
		{ sessionId: hashToken(token) }
	);
	return { session, cookie: cookieSpec(token) };
}

export type ValidatedSession =
	| { user: SessionUser; session: UserSession; refreshCookie: CookieSpec | null }
	| { user: null; session: null; refreshCookie: CookieSpec | null };

export async function validateSessionToken(token: string | undefined): Promise<ValidatedSession> {
	if (!token) return { user: null, session: null, refreshCookie: null };
	const sessionId = hashToken(token);
	const { session, user } = await lucia.validateSession(sessionId);
	if (!session || !user) {
		return { user: null, session: null, refreshCookie: cookieSpec('', true) };
	}
	const ageS = Math.floor(Date.now() / 1000) - session.issuedAt;
	if (ageS > SESSION_ABSOLUTE_TIMEOUT_S || !user.active) {
		await lucia.invalidateSession(sessionId);
		return { user: null, session: null, refreshCookie: cookieSpec('', true) };
	}
	// lucia extended the expiry (sliding idle timeout): send the cookie again with the new date.
	return { user, session, refreshCookie: session.fresh ? cookieSpec(token) : null };
}

export async function invalidateSession(session: UserSession) {
	await lucia.invalidateSession(session.id);
}

export async function invalidateUserSessions(userId: string) {
	await lucia.invalidateUserSessions(userId);
}

export const blankSessionCookie = () => cookieSpec('', true);
