import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { createDatabase, prepareDatabase } from '../../src/lib/server/db/client';
import { auditLog, shops } from '../../src/lib/server/db/schema';

/** A fresh SQLite file in a folder that does not exist yet (libSQL cannot create the folder). */
async function freshDatabase() {
	const dir = join(mkdtempSync(join(tmpdir(), 'causeway-db-')), 'nested', 'data');
	const db = createDatabase(`file:${join(dir, 'test.db')}`);
	await prepareDatabase(db, 'drizzle');
	return db;
}

const pragma = async (db: Awaited<ReturnType<typeof freshDatabase>>, name: string) =>
	(await db.$client.execute(`PRAGMA ${name}`)).rows[0][0];

describe('the SQLite database through libSQL', () => {
	it('creates its folder, applies the migrations and runs in WAL mode', async () => {
		const db = await freshDatabase();
		expect(await pragma(db, 'journal_mode')).toBe('wal');
		const tables = await db.$client.execute("SELECT name FROM sqlite_master WHERE type = 'table'");
		expect(tables.rows.map((r) => r.name)).toEqual(
			expect.arrayContaining([
				'shops',
				'users',
				'sessions',
				'api_keys',
				'audit_log',
				'rate_limits',
				'rulebook_editions'
			])
		);
	});

	it('keeps foreign keys and the busy timeout on after an interactive transaction', async () => {
		const db = await freshDatabase();
		const tx = await db.$client.transaction('write');
		await tx.execute("INSERT INTO shops (id, name) VALUES ('s1', 'Test Shop')");
		await tx.commit();
		expect(await pragma(db, 'foreign_keys')).toBe(1);
		expect(await pragma(db, 'busy_timeout')).toBe(5000);
		const failure = await db
			.insert(auditLog)
			.values({ shopId: 'no-such-shop', action: 'x' })
			.then(
				() => null,
				(err: Error) => err
			);
		expect(String(failure?.cause ?? failure)).toMatch(/FOREIGN KEY/);
	});

	it('configures every connection of the pool, not only the first', async () => {
		const db = await freshDatabase();
		// A transaction holds one connection; queries started in the same tick each borrow
		// another, so the pool opens new ones.
		const tx = await db.$client.transaction('write');
		const settings = await Promise.all(
			['synchronous', 'foreign_keys', 'busy_timeout', 'synchronous'].map((name) => pragma(db, name))
		);
		await tx.rollback();
		// synchronous 1 = NORMAL (sqlite.org/pragma.html#pragma_synchronous); 2 = FULL would fsync
		// the WAL on every commit.
		expect(settings).toEqual([1, 1, 5000, 1]);
	});

	it('loses no row when many writers insert at once', async () => {
		const db = await freshDatabase();
		await db.insert(shops).values({ id: 'busy', name: 'Busy Bay Garage' });
		const writers = 50;
		const perWriter = 20;
		await Promise.all(
			Array.from({ length: writers }, async (_, w) => {
				for (let i = 0; i < perWriter; i++) {
					await db.insert(auditLog).values({ shopId: 'busy', action: `answer.${w}.${i}` });
				}
			})
		);
		const [{ n }] = await db.select({ n: sql<number>`count(*)` }).from(auditLog);
		expect(n).toBe(writers * perWriter);
	});
});
