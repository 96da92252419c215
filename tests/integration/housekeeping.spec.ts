import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

describe('housekeeping', () => {
	it('deletes expired sessions and stale counters, and keeps live ones and running lock-outs', async () => {
		process.env.DATABASE_URL = `file:${join(mkdtempSync(join(tmpdir(), 'causeway-sweep-')), 'c.db')}`;
		const { db, prepare } = await import('../../src/lib/server/db');
		const { sweepExpired } = await import('../../src/lib/server/housekeeping');
		await prepare();
		const now = Math.floor(Date.now() / 1000);
		const day = 24 * 60 * 60;
		const client = db.$client;
		await client.batch([
			"INSERT INTO shops (id, name) VALUES ('s', 'Sweep Street Garage')",
			"INSERT INTO users (id, shop_id, email, name, role, password_hash) VALUES ('u', 's', 'u@sweep.example', 'U', 'technician', 'x')",
			{
				sql: "INSERT INTO sessions (id, user_id, expires_at, issued_at) VALUES ('old', 'u', ?, ?)",
				args: [now - 60, now - day]
			},
			{
				sql: "INSERT INTO sessions (id, user_id, expires_at, issued_at) VALUES ('live', 'u', ?, ?)",
				args: [now + 3600, now]
			},
			{
				sql: "INSERT INTO rate_limits (key, count, window_start) VALUES ('stale', 3, ?)",
				args: [now - 2 * day]
			},
			{
				sql: "INSERT INTO rate_limits (key, count, window_start) VALUES ('fresh', 3, ?)",
				args: [now - 60]
			},
			{
				sql: "INSERT INTO rate_limits (key, count, window_start, locked_until) VALUES ('locked', 9, ?, ?)",
				args: [now - 2 * day, now + 600]
			}
		]);
		await sweepExpired(now);
		const sessions = await client.execute('SELECT id FROM sessions ORDER BY id');
		expect(sessions.rows.map((r) => r.id)).toEqual(['live']);
		const counters = await client.execute('SELECT key FROM rate_limits ORDER BY key');
		expect(counters.rows.map((r) => r.key)).toEqual(['fresh', 'locked']);
	});
});
