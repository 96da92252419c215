// The lucia instance and session timeouts; only this folder uses lucia.
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import { db } from '../db';
import { sessions, users, type Role } from '../db/schema';

/**
 * lucia stays behind src/lib/server/auth: nothing else imports it, so it can be swapped for a
 * hand-written session store without touching routes. lucia stores the session id as given; we
 * give it the SHA-256 of the cookie token (see session.ts), so the database never holds a token.
 */
export const SESSION_IDLE_TIMEOUT = new TimeSpan(12, 'h');
export const SESSION_ABSOLUTE_TIMEOUT_S = 7 * 24 * 60 * 60;

const adapter = new DrizzleSQLiteAdapter(db, sessions, users);

export const lucia = new Lucia(adapter, {
	sessionExpiresIn: SESSION_IDLE_TIMEOUT,
	sessionCookie: {
		name: 'causeway_session',
		attributes: {
			secure: process.env.NODE_ENV === 'production',
			sameSite: 'lax'
		}
	},
	getSessionAttributes: (attributes) => ({ issuedAt: attributes.issuedAt }),
	getUserAttributes: (attributes) => ({
		shopId: attributes.shopId,
		email: attributes.email,
		name: attributes.name,
		role: attributes.role,
		active: attributes.active
	})
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseSessionAttributes: { issuedAt: number };
		DatabaseUserAttributes: {
			shopId: string;
			email: string;
			name: string;
			role: Role;
			active: boolean;
		};
	}
}
