/** Limits on sign-up, reset and invite requests, counted in the database on every attempt. */
import { sql } from 'drizzle-orm';
import { db } from '../db';
import { rateLimits } from '../db/schema';

const nowS = () => Math.floor(Date.now() / 1000);

/**
 * The upsert for `n` buckets, prepared once: query building costs more than the query itself.
 * A bucket restarts at 1 once its window has passed.
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
 * Counts a hit in each bucket with one atomic statement (one commit), before the work it
 * guards, so a burst of parallel requests cannot slip past the limit. Counters live in the
 * database so several app servers share them. Returns the tightest answer.
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
