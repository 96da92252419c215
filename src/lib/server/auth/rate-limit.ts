import { eq, sql } from 'drizzle-orm';
import { getConfig } from '../config';
import { db } from '../db';
import { rateLimits } from '../db/schema';
import { createRateCounter, type RateCounter } from './rate-counter';

const nowS = () => Math.floor(Date.now() / 1000);

/**
 * The upsert for `n` buckets, prepared once: query building costs more than the query itself on
 * the API's hot path. A bucket restarts at 1 once its window has passed.
 */
const upserts = new Map<number, ReturnType<typeof prepareUpsert>>();

function prepareUpsert(n: number) {
	const windowFloor = sql.placeholder('windowFloor');
	const now = sql.placeholder('now');
	return db
		.insert(rateLimits)
		.values(
			Array.from({ length: n }, (_, i) => ({
				key: sql.placeholder(`key${i}`),
				count: 1,
				windowStart: now
			}))
		)
		.onConflictDoUpdate({
			target: rateLimits.key,
			set: {
				count: sql`CASE WHEN ${rateLimits.windowStart} <= ${windowFloor} THEN 1 ELSE ${rateLimits.count} + 1 END`,
				windowStart: sql`CASE WHEN ${rateLimits.windowStart} <= ${windowFloor} THEN ${now} ELSE ${rateLimits.windowStart} END`
			}
		})
		.returning({
			key: rateLimits.key,
			count: rateLimits.count,
			windowStart: rateLimits.windowStart
		})
		.prepare();
}

/**
 * Counts a hit in each bucket with one atomic statement (one commit). Counters live in the
 * database so several app servers share them. Returns the tightest answer. For sign-in, sign-up
 * and reset, where every attempt must count at once; the API uses `apiRateCounter`.
 */
export async function hitRateLimits(
	buckets: { key: string; limit: number }[],
	windowS: number,
	now = nowS()
) {
	let upsert = upserts.get(buckets.length);
	if (!upsert) upserts.set(buckets.length, (upsert = prepareUpsert(buckets.length)));
	const params: Record<string, string | number> = { now, windowFloor: now - windowS };
	buckets.forEach((bucket, i) => (params[`key${i}`] = bucket.key));
	const rows = await upsert.all(params);
	let retryAfterS = 0;
	let count = 0;
	for (const row of rows) {
		const limit = buckets.find((b) => b.key === row.key)!.limit;
		count = Math.max(count, row.count);
		if (row.count > limit) retryAfterS = Math.max(retryAfterS, row.windowStart + windowS - now, 1);
	}
	return { allowed: retryAfterS === 0, retryAfterS, count };
}

export function hitRateLimit(key: string, limit: number, windowS: number, now = nowS()) {
	return hitRateLimits([{ key, limit }], windowS, now);
}

let apiCounter: RateCounter | undefined;

/** The API's per-minute counters per address and per key: see `createRateCounter`. */
export function apiRateCounter(): RateCounter {
	apiCounter ??= createRateCounter(db, {
		windowS: 60,
		syncMs: getConfig().RATE_LIMIT_SYNC_MS,
		onError: (error) => console.error('writing API rate counters failed', error)
	});
	return apiCounter;
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
