/** The sign-in lock-out: attempts counted per account and per address before any password is checked. */
import { eq, inArray, sql } from 'drizzle-orm';
import { db } from '../db';
import { rateLimits } from '../db/schema';

const nowS = () => Math.floor(Date.now() / 1000);

export const SIGNIN_WINDOW_S = 15 * 60;
const LOCK_BASE_S = 30;
const LOCK_MAX_S = 15 * 60;
/** 30 s << 5 is past the longest lock already. */
const LOCK_MAX_DOUBLINGS = 5;

/** A workshop shares one address, so the address gets four times an account's allowance. */
export const ADDRESS_ALLOWANCE_FACTOR = 4;

export type SignInKeys = { account: string; address: string };

export const signInKeys = (email: string, ip: string): SignInKeys => ({
	account: `login:account:${email.toLowerCase()}`,
	address: `login:ip:${ip}`
});

/**
 * Counts one attempt in a bucket and returns the row, in one statement: a restarted window
 * counts from 1; the attempt that reaches the allowance sets the lock, which doubles with each
 * attempt past it (30 s, 60 s … at most 15 minutes) and never lasts longer. While a bucket is
 * locked, the conflict clause's WHERE is false: nothing changes and no row comes back.
 */
function countAttemptStatement(key: string, allowance: number, now: number) {
	const restarted = sql`${rateLimits.windowStart} <= ${now - SIGNIN_WINDOW_S}`;
	const newCount = sql`(CASE WHEN ${restarted} THEN 1 ELSE ${rateLimits.count} + 1 END)`;
	const lockS = sql`MIN(${LOCK_MAX_S}, ${LOCK_BASE_S} << MIN(${newCount} - ${allowance}, ${LOCK_MAX_DOUBLINGS}))`;
	return db
		.insert(rateLimits)
		.values({
			key,
			count: 1,
			windowStart: now,
			lockedUntil: allowance <= 1 ? now + LOCK_BASE_S : null
		})
		.onConflictDoUpdate({
			target: rateLimits.key,
			set: {
				count: newCount,
				windowStart: sql`CASE WHEN ${restarted} THEN ${now} ELSE ${rateLimits.windowStart} END`,
				lockedUntil: sql`CASE WHEN ${newCount} >= ${allowance} THEN ${now} + ${lockS} ELSE NULL END`
			},
			setWhere: sql`${rateLimits.lockedUntil} IS NULL OR ${rateLimits.lockedUntil} <= ${now}`
		})
		.returning({ key: rateLimits.key });
}

export type SignInAttempt = { allowed: true } | { allowed: false; retryAfterS: number };

/**
 * Counts a sign-in attempt for the account and the address atomically (one batch, one commit)
 * and decides whether its password may be checked. Called before the slow hash, so parallel
 * attempts see each other's counts: of any burst, at most `maxAttempts` reach the hash.
 */
export async function countSignInAttempt(
	keys: SignInKeys,
	maxAttempts: number,
	now = nowS()
): Promise<SignInAttempt> {
	const [account, address] = await db.batch([
		countAttemptStatement(keys.account, maxAttempts, now),
		countAttemptStatement(keys.address, maxAttempts * ADDRESS_ALLOWANCE_FACTOR, now)
	]);
	if (account.length > 0 && address.length > 0) return { allowed: true };
	const rows = await db
		.select({ lockedUntil: rateLimits.lockedUntil })
		.from(rateLimits)
		.where(inArray(rateLimits.key, [keys.account, keys.address]));
	const wait = Math.max(0, ...rows.map((row) => (row.lockedUntil ?? 0) - now));
	return { allowed: false, retryAfterS: Math.max(wait, 1) };
}

/**
 * After a right password: the account's earlier failures are forgiven, and the address gets
 * back the attempt that succeeded (a workshop's people signing in each morning are not failures).
 */
export async function recordSignInSuccess(keys: SignInKeys, maxAttempts: number) {
	const allowance = maxAttempts * ADDRESS_ALLOWANCE_FACTOR;
	await db.batch([
		db.delete(rateLimits).where(eq(rateLimits.key, keys.account)),
		db
			.update(rateLimits)
			.set({
				count: sql`MAX(${rateLimits.count} - 1, 0)`,
				lockedUntil: sql`CASE WHEN ${rateLimits.count} - 1 < ${allowance} THEN NULL ELSE ${rateLimits.lockedUntil} END`
			})
			.where(eq(rateLimits.key, keys.address))
	]);
}
