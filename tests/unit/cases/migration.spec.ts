import { createClient } from '@libsql/client';
import { drizzle } from 'drizzle-orm/libsql';
import { migrate } from 'drizzle-orm/libsql/migrator';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const dir = mkdtempSync(join(tmpdir(), 'causeway-migration-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The migrations folder as it stood before the case timeline: only the first migration. */
function firstMigrationOnly() {
	const folder = join(dir, 'first');
	mkdirSync(join(folder, 'meta'), { recursive: true });
	copyFileSync('drizzle/0000_init.sql', join(folder, '0000_init.sql'));
	const journal = JSON.parse(readFileSync('drizzle/meta/_journal.json', 'utf8'));
	journal.entries = journal.entries.slice(0, 1);
	writeFileSync(join(folder, 'meta/_journal.json'), JSON.stringify(journal));
	return folder;
}

describe('migrating cases saved before the timeline existed', () => {
	it('keeps every case, makes vehicle rows (one per VIN) and a first event with the old ranking', async () => {
		const client = createClient({ url: `file:${join(dir, 'old.db')}` });
		const db = drizzle(client);
		await migrate(db, { migrationsFolder: firstMigrationOnly() });
		await client.execute("INSERT INTO shops (id, name) VALUES ('s1', 'Saltmarsh Lane Garage')");
		await client.execute(
			"INSERT INTO rulebook_editions (id, shop_id, number, status, content) VALUES ('e1', 's1', 1, 'published', '{}')"
		);
		const result = JSON.stringify({
			causes: [
				{ key: 'cooling_fan_fault', probability: 0.6 },
				{ key: 'trapped_air', probability: 0.2 },
				{ key: 'radiator_leak', probability: 0.1 },
				{ key: 'pressure_cap_fault', probability: 0.05 }
			]
		});
		const insert = (id: string, vehicle: unknown, observations = '{}', unknown = '[]') =>
			client.execute({
				sql: `INSERT INTO cases (id, shop_id, edition_id, source, vehicle, complaint, observations, unknown, result)
					VALUES (?, 's1', 'e1', 'api', ?, 'runs hot in traffic', ?, ?, ?)`,
				args: [id, vehicle === null ? null : JSON.stringify(vehicle), observations, unknown, result]
			});
		// 49 CFR Part 565 worked example VIN, check digit X; the second case sends it lower case.
		await insert(
			'c1',
			{ vin: '1M8GDM9AXKP042788', year: 2014, odometerKm: 182000 },
			'{"temp_gauge":"high_at_idle"}',
			'["fan_circuit_test"]'
		);
		await insert('c2', { vin: ' 1m8gdm9axkp042788', make: 'Tollard' });
		await insert('c3', { make: 'Harrow', model: 'Fen' });
		await insert('c4', null);

		await migrate(db, { migrationsFolder: 'drizzle' });

		const vehicles = (await client.execute('SELECT id, vin, year, make FROM vehicles ORDER BY id'))
			.rows;
		expect(vehicles.map((v) => [v.vin, v.year, v.make])).toEqual([
			['1M8GDM9AXKP042788', 2014, null],
			[null, null, 'Harrow']
		]);
		const cases = (
			await client.execute(
				'SELECT id, status, vehicle_id, odometer_value, odometer_unit, last_seq, top_causes FROM cases ORDER BY id'
			)
		).rows;
		expect(cases).toHaveLength(4);
		expect(cases[0].vehicle_id).toBe(cases[1].vehicle_id);
		expect(cases[3].vehicle_id).toBeNull();
		expect([cases[0].odometer_value, cases[0].odometer_unit]).toEqual([182000, 'km']);
		expect(cases.every((c) => c.status === 'waiting' && c.last_seq === 1)).toBe(true);
		expect(JSON.parse(String(cases[0].top_causes)).map((c: { key: string }) => c.key)).toEqual([
			'cooling_fan_fault',
			'trapped_air',
			'radiator_leak'
		]);
		const [first] = (
			await client.execute(
				"SELECT kind, seq, payload, ranking FROM case_events WHERE case_id = 'c1'"
			)
		).rows;
		expect(first.kind).toBe('case_opened');
		expect(JSON.parse(String(first.payload))).toEqual({
			observations: { temp_gauge: 'high_at_idle' },
			unknown: ['fan_circuit_test'],
			complaint: 'runs hot in traffic'
		});
		expect(JSON.parse(String(first.ranking))).toHaveLength(4);
		expect((await client.execute('PRAGMA foreign_key_check')).rows).toEqual([]);
		client.close();
	}, 30_000); // real migrations on a SQLite file: slow when the machine is busy
});
