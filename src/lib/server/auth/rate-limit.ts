import { eq, sql } from 'drizzle-orm';
import { db } from '../db';
import { rateLimits } from '../db/schema';

/**
 * Counters live in the database so several app servers share them. Each hit is one atomic
 * upsert: a fixed window that restarts once `windowS` has passed.
 */
export async function hitRateLimit(key: string, limit: number, windowS: number, now = nowS()) {
	const rows = await db
		.insert(rateLimits)
		.values({ key, count: 1, windowStart: now })
		.onConflictDoUpdate({
			target: rateLimits.key,
			set: {
				count: sql`CASE WHEN ${rateLimits.windowStart} <= ${now - windowS} THEN 1 ELSE ${rateLimits.count} + 1 END`,
				windowStart: sql`CASE WHEN ${rateLimits.windowStart} <= ${now - windowS} THEN ${now} ELSE ${rateLimits.windowStart} END`
			}
		})
		.returning({ count: rateLimits.count, windowStart: rateLimits.windowStart });
	const { count, windowStart } = rows[0];
	return {
		count,
		allowed: count <= limit,
		remaining: Math.max(0, limit - count),
		retryAfterS: Math.max(1, windowStart + windowS - now)
	};
}

const nowS = () => Math.floor(Date.now() / 1000);

/**
 * Several buckets in one upsert (one statement, one commit): the API counts each request per
 * address and per key in a single write. Returns the tightest answer.
 */
export async function hitRateLimits(
	buckets: { key: string; limit: number }[],
	windowS: number,
	now = nowS()
) {
	const rows = await db
		.insert(rateLimits)
		.values(buckets.map(({ key }) => ({ key, count: 1, windowStart: now })))
		.onConflictDoUpdate({
			target: rateLimits.key,
			set: {
				count: sql`CASE WHEN ${rateLimits.windowStart} <= ${now - windowS} THEN 1 ELSE ${rateLimits.count} + 1 END`,
				windowStart: sql`CASE WHEN ${rateLimits.windowStart} <= ${now - windowS} THEN ${now} ELSE ${rateLimits.windowStart} END`
			}
		})
		.returning({
			key: rateLimits.key,
			count: rateLimits.count,
			windowStart: rateLimits.windowStart
		});
	let retryAfterS = 0;
	for (const row of rows) {
		const limit = buckets.find((b) => b.key === row.key)!.limit;
		if (row.count > limit) retryAfterS = Math.max(retryAfterS, row.windowStart + windowS - now, 1);
	}
	return { allowed: retryAfterS === 0, retryAfterS };
}

/** Failed sign-ins: counted per account and per IP; the lock grows with each failure, never permanent. */
const LOGIN_WINDOW_S = 15 * 60;
const LOCK_BASE_S = 30;
const LOCK_MAX_S = 15 * 60;

export const loginKeys = (email: string, ip: string) => [
	`login:account:${email.toLowerCase()}`,
	`login:ip:${ip}`
];

/** Seconds until sign-in may be tried again for any of the keys, or 0. */
export async function loginLockedForS(keys: string[], now = nowS()): Promise<number> {
	let wait = 0;
	for (const key of keys) {
		const [row] = await db.select().from(rateLimits).where(eq(rateLimits.key, key));
		if (row?.lockedUntil && row.lockedUntil > now) wait = Math.max(wait, row.lockedUntil - now);
	}
	return wait;
}

/**
 * Records a failed sign-in. Past `maxAttempts` failures in the window, each further failure locks
 * for twice as long as the one before (30 s, 60 s, 120 s … at most 15 minutes). The IP gets four
 * times the allowance because a workshop shares one address.
 */
export async function recordLoginFailure(keys: string[], maxAttempts: number, now = nowS()) {
	for (const key of keys) {
		const allowance = key.startsWith('login:ip:') ? maxAttempts * 4 : maxAttempts;
		const { count } = await hitRateLimit(key, allowance, LOGIN_WINDOW_S, now);
		if (count >= allowance) {
			const lockS = Math.min(LOCK_MAX_S, LOCK_BASE_S * 2 ** (count - allowance));
			await db
				.update(rateLimits)
				.set({ lockedUntil: now + lockS })
				.where(eq(rateLimits.key, key));
		}
	}
}

export async function clearLoginFailures(email: string) {
	await db.delete(rateLimits).where(eq(rateLimits.key, loginKeys(email, '')[0]));
}
