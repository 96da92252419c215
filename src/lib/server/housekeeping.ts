// Housekeeping: deletes expired sessions and stale rate-limit counters, at start and on a timer.
import { and, isNull, lt, or } from 'drizzle-orm';
import { lucia } from './auth/lucia';
import { db } from './db';
import { rateLimits } from './db/schema';

/** Counters older than this are over in every window we use (the longest is an hour). */
const STALE_COUNTER_S = 24 * 60 * 60;
const HOUSEKEEPING_INTERVAL_MS = 15 * 60 * 1000;

/**
 * Deletes expired sessions and stale rate-limit counters, so neither table grows without bound
 * (failed sign-ins with made-up addresses each leave a counter behind).
 */
export async function sweepExpired(now = Math.floor(Date.now() / 1000)) {
	await lucia.deleteExpiredSessions();
	await db
		.delete(rateLimits)
		.where(
			and(
				lt(rateLimits.windowStart, now - STALE_COUNTER_S),
				or(isNull(rateLimits.lockedUntil), lt(rateLimits.lockedUntil, now))
			)
		);
}

export function startHousekeeping() {
	const timer = setInterval(() => {
		sweepExpired().catch((err) => console.error('housekeeping failed', err));
	}, HOUSEKEEPING_INTERVAL_MS);
	timer.unref();
}
