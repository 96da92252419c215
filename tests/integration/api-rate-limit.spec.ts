import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { createRateCounter } from '../../src/lib/server/auth/api-rate-limit';
import { createDatabase, prepareDatabase } from '../../src/lib/server/db/client';
import { rateLimits } from '../../src/lib/server/db/schema';

/** Two clients on one SQLite file stand for two app servers sharing a database. */
async function sharedDatabase() {
	const file = join(mkdtempSync(join(tmpdir(), 'causeway-rate-')), 'rate.db');
	const first = createDatabase(`file:${file}`);
	await prepareDatabase(first, 'drizzle');
	return [first, createDatabase(`file:${file}`)] as const;
}

// 10:00:05 on some day: five seconds into a one-minute window. The counters read this clock, never
// the machine's, so the outcome is the same at any hour (close() flushes at "now").
const T = Date.UTC(2026, 11, 2, 10, 0, 5);
const options = { windowS: 60, syncMs: 60_000, now: () => T };

describe('API rate counters shared through the database', () => {
	it('is exact within one server without waiting for the database', async () => {
		const [db] = await sharedDatabase();
		const counter = createRateCounter(db, options);
		const decisions = Array.from({ length: 7 }, () =>
			counter.hit([{ key: 'api:key:k1', limit: 5 }], T)
		);
		expect(decisions.map((d) => d.allowed)).toEqual([true, true, true, true, true, false, false]);
		// The window ends at 10:01:00, 55 s after T.
		expect(decisions[6].retryAfterS).toBe(55);
		await counter.close();
	});

	it('writes the hits of all buckets in one go and keeps the totals in the database', async () => {
		const [db] = await sharedDatabase();
		const counter = createRateCounter(db, options);
		for (let i = 0; i < 4; i++) {
			counter.hit(
				[
					{ key: 'api:ip:203.0.113.7', limit: 100 },
					{ key: 'api:key:k1', limit: 100 }
				],
				T
			);
		}
		await counter.flush(T);
		counter.hit([{ key: 'api:key:k1', limit: 100 }], T);
		await counter.close();
		const rows = await db.select().from(rateLimits);
		expect(Object.fromEntries(rows.map((r) => [r.key, r.count]))).toEqual({
			'api:ip:203.0.113.7': 4,
			'api:key:k1': 5
		});
		// Aligned to the minute, so every server agrees on the window.
		expect(new Set(rows.map((r) => r.windowStart))).toEqual(new Set([T / 1000 - 5]));
	});

	it('lets two servers see each other’s hits once they have written them', async () => {
		const [dbA, dbB] = await sharedDatabase();
		const a = createRateCounter(dbA, options);
		const b = createRateCounter(dbB, options);
		const bucket = [{ key: 'api:key:shared', limit: 5 }];
		for (let i = 0; i < 3; i++) {
			expect(a.hit(bucket, T).allowed).toBe(true);
			expect(b.hit(bucket, T).allowed).toBe(true);
		}
		await a.flush(T); // the database holds 3
		await b.flush(T); // 6: B learns A's hits
		expect(b.hit(bucket, T).allowed).toBe(false);
		// A has not written since B did, so it still counts 3 + 1.
		expect(a.hit(bucket, T).allowed).toBe(true);
		await a.flush(T); // A writes its fourth hit and reads 7 (B's refused hit is not written yet)
		expect(a.hit(bucket, T).allowed).toBe(false);
		await Promise.all([a.close(), b.close()]);
		const [row] = await dbA.select().from(rateLimits).where(eq(rateLimits.key, 'api:key:shared'));
		expect(row.count).toBe(9);
	});

	it('starts a new window at the minute, forgetting the last one', async () => {
		const [db] = await sharedDatabase();
		const counter = createRateCounter(db, options);
		const bucket = [{ key: 'api:key:k1', limit: 2 }];
		counter.hit(bucket, T);
		counter.hit(bucket, T);
		expect(counter.hit(bucket, T).allowed).toBe(false);
		await counter.flush(T);
		const nextMinute = T + 55_000;
		expect(counter.hit(bucket, nextMinute)).toMatchObject({ allowed: true, count: 1 });
		await counter.flush(nextMinute);
		const [row] = await db.select().from(rateLimits);
		expect(row).toMatchObject({ count: 1, windowStart: nextMinute / 1000 });
		await counter.close();
	});

	it('writes on its own after syncMs', async () => {
		const [db] = await sharedDatabase();
		const counter = createRateCounter(db, { windowS: 60, syncMs: 20, now: () => T });
		counter.hit([{ key: 'api:key:timer', limit: 10 }]);
		counter.hit([{ key: 'api:key:timer', limit: 10 }]);
		await expect
			.poll(async () => (await db.select().from(rateLimits))[0]?.count, { timeout: 2000 })
			.toBe(2);
		await counter.close();
	});
});
