/** The API's per-minute limits per key and per address, shared by servers without a write per request. */
import { sql } from 'drizzle-orm';
import { getConfig } from '../config';
import { db as appDb } from '../db';
import type { Database } from '../db/client';
import { rateLimits } from '../db/schema';

export type Bucket = { key: string; limit: number };

export type RateDecision = { allowed: boolean; retryAfterS: number; count: number };

export interface RateCounter {
	/** Counts one hit in each bucket and decides at once, without waiting for the database. */
	hit(buckets: readonly Bucket[], nowMs?: number): RateDecision;
	/** Writes the hits counted since the last write and learns the other servers' counts. */
	flush(nowMs?: number): Promise<void>;
	/** Stops the timer after a last write. */
	close(): Promise<void>;
}

type Entry = {
	windowStart: number;
	/** The database's count for this window when this process last wrote (all servers). */
	shared: number;
	/** Hits being written right now. */
	inFlight: number;
	/** Hits not written yet. */
	pending: number;
};

/** Hits of one write: the bucket's key, its entry and how many hits are being written. */
type Batch = [string, Entry, number][];

/** Counts one hit in each bucket's entry for this window; over a limit, says when it ends. */
function countHit(
	entries: Map<string, Entry>,
	buckets: readonly Bucket[],
	at: { windowStart: number; windowMs: number; nowMs: number }
): RateDecision {
	const { windowStart, windowMs, nowMs } = at;
	let retryAfterS = 0;
	let count = 0;
	for (const bucket of buckets) {
		let entry = entries.get(bucket.key);
		if (!entry || entry.windowStart < windowStart) {
			entry = { windowStart, shared: 0, inFlight: 0, pending: 0 };
			entries.set(bucket.key, entry);
		}
		entry.pending += 1;
		const total = entry.shared + entry.inFlight + entry.pending;
		count = Math.max(count, total);
		if (total > bucket.limit) {
			const endsInS = Math.ceil((windowStart * 1000 + windowMs - nowMs) / 1000);
			retryAfterS = Math.max(retryAfterS, endsInS, 1);
		}
	}
	return { allowed: retryAfterS === 0, retryAfterS, count };
}

/** Moves the pending hits of this window in flight, and forgets past windows' entries. */
function takePending(entries: Map<string, Entry>, windowStart: number): Batch {
	const batch: Batch = [];
	for (const [key, entry] of entries) {
		if (entry.windowStart < windowStart) {
			// Past windows are over: their last hits no longer limit anyone.
			if (entry.inFlight === 0) entries.delete(key);
			continue;
		}
		if (entry.pending === 0) continue;
		batch.push([key, entry, entry.pending]);
		entry.inFlight += entry.pending;
		entry.pending = 0;
	}
	return batch;
}

/** Adds the batch to the shared counters in one statement; returns their totals by key. */
async function addCounts(db: Database, batch: Batch): Promise<Map<string, number>> {
	// A counter left from an earlier window starts again; one from a later window (another
	// server's clock running ahead) is kept as it is.
	const rows = await db
		.insert(rateLimits)
		.values(
			batch.map(([key, entry, hits]) => ({
				key,
				count: hits,
				windowStart: entry.windowStart
			}))
		)
		.onConflictDoUpdate({
			target: rateLimits.key,
			set: {
				count: sql`CASE
					WHEN ${rateLimits.windowStart} = excluded.window_start THEN ${rateLimits.count} + excluded.count
					WHEN ${rateLimits.windowStart} > excluded.window_start THEN ${rateLimits.count}
					ELSE excluded.count END`,
				windowStart: sql`MAX(${rateLimits.windowStart}, excluded.window_start)`
			}
		})
		.returning({ key: rateLimits.key, count: rateLimits.count });
	return new Map(rows.map((row) => [row.key, row.count]));
}

/** The batch is written: its hits are no longer in flight, and entries learn the totals. */
function settleBatch(entries: Map<string, Entry>, batch: Batch, totals: Map<string, number>) {
	for (const [key, entry, hits] of batch) {
		entry.inFlight -= hits;
		if (entries.get(key) === entry) entry.shared = totals.get(key) ?? entry.shared + hits;
	}
}

export type RateCounterOptions = {
	windowS: number;
	syncMs: number;
	onError?: (error: unknown) => void;
	/** The clock, in ms; tests give a fixed one. */
	now?: () => number;
};

/**
 * Per-minute API counters shared through the `rate_limits` table without a write per request.
 *
 * Windows are aligned to the clock (every server agrees on them without talking). Each process
 * counts its own hits in memory and decides at once; every `syncMs` it adds them to the
 * database's counters in one statement and reads back the totals, which include the other
 * servers' hits. One server alone is therefore exact; several together see each other's traffic
 * at most `syncMs` late, so a key can exceed its limit by what the other servers admit in that
 * time. Sign-in, sign-up, reset and invite limits do not use this: they write on every attempt
 * (`signin-throttle.ts`, `form-rate-limit.ts`), because there a few extra tries matter.
 */
export function createRateCounter(db: Database, options: RateCounterOptions): RateCounter {
	const windowMs = options.windowS * 1000;
	const clock = options.now ?? Date.now;
	const entries = new Map<string, Entry>();
	let timer: ReturnType<typeof setTimeout> | undefined;
	let flushing: Promise<void> | undefined;
	let closed = false;

	const currentWindow = (nowMs: number) => Math.floor(nowMs / windowMs) * options.windowS;

	function schedule() {
		if (timer || closed) return;
		timer = setTimeout(() => {
			timer = undefined;
			flush().catch((error) => (options.onError ?? console.error)(error));
		}, options.syncMs);
		timer.unref?.();
	}

	function hit(buckets: readonly Bucket[], nowMs = clock()): RateDecision {
		const decision = countHit(entries, buckets, {
			windowStart: currentWindow(nowMs),
			windowMs,
			nowMs
		});
		schedule();
		return decision;
	}

	async function write(nowMs: number) {
		const batch = takePending(entries, currentWindow(nowMs));
		if (batch.length === 0) return;
		try {
			settleBatch(entries, batch, await addCounts(db, batch));
		} catch (error) {
			// Nothing was written: count the hits again next time.
			for (const [, entry, hits] of batch) {
				entry.inFlight -= hits;
				entry.pending += hits;
			}
			schedule();
			throw error;
		}
	}

	async function flush(nowMs = clock()) {
		// One write at a time, so hits are never added twice.
		while (flushing) await flushing;
		flushing = write(nowMs).finally(() => (flushing = undefined));
		return flushing;
	}

	return {
		hit,
		flush,
		async close() {
			closed = true;
			if (timer) clearTimeout(timer);
			timer = undefined;
			await flush();
		}
	};
}

let apiCounter: RateCounter | undefined;

/** The API's per-minute counters per address and per key: see `createRateCounter`. */
export function apiRateCounter(): RateCounter {
	apiCounter ??= createRateCounter(appDb, {
		windowS: 60,
		syncMs: getConfig().RATE_LIMIT_SYNC_MS,
		onError: (error) => console.error('writing API rate counters failed', error)
	});
	return apiCounter;
}
