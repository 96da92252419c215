import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Client } from '../support/client';
import { createShop, DEMO, DEMO_API_KEY, DEMO_PASSWORD, newClient, openServerDb } from './helpers';

// 49 CFR Part 565 worked example: check digit X.
const VIN = '1M8GDM9AXKP042788';

let tech: Client;
let lead: Client;

beforeAll(async () => {
	tech = newClient();
	await tech.signIn(DEMO.technician, DEMO_PASSWORD);
	lead = newClient();
	await lead.signIn(DEMO.lead, DEMO_PASSWORD);
});

async function count(sql: string, args: (string | number)[] = []) {
	const db = openServerDb();
	const n = Number((await db.execute({ sql, args })).rows[0].n);
	db.close();
	return n;
}
const eventCount = (caseId: string) =>
	count('SELECT count(*) AS n FROM case_events WHERE case_id = ?', [caseId]);

async function openCase(client: Client, body: Record<string, unknown> = {}) {
	const res = await client.json('/api/v1/cases', {
		vehicle: { plate: 'SL15 MRV', make: 'Tollard', model: 'Marsh Van' },
		complaint: 'gets hot sitting in traffic, fine on the motorway',
		...body
	});
	expect(res.status).toBe(201);
	return res.body;
}

const append = (
	client: Client,
	caseId: string,
	kind: string,
	payload: unknown,
	id = randomUUID()
) => client.json(`/api/v1/cases/${caseId}/events`, { id, kind, payload });

describe('cases: create, read, list', () => {
	it('opens a case on a vehicle found by its VIN, assigned to the technician, with a first ranking', async () => {
		const first = await openCase(tech, {
			vehicle: { vin: VIN.toLowerCase(), year: 2014, make: 'Tollard', model: 'Marsh Van' },
			odometer: { value: 118_000, unit: 'mi' },
			observations: { coolant_level: 'low' }
		});
		expect(first.case.status).toBe('open');
		expect(first.case.source).toBe('bay');
		expect(first.case.assignee.name).toBe('Rowan Hale');
		expect(first.case.vehicle.vin).toBe(VIN);
		expect(first.case.odometer).toEqual({ value: 118_000, unit: 'mi' });
		expect(first.answers).toEqual([
			{ key: 'coolant_level', value: 'low', seq: 1, source: 'intake' }
		]);
		expect(first.timeline).toHaveLength(1);
		expect(first.timeline[0].kind).toBe('case_opened');
		expect(first.timeline[0].ranking.length).toBe(first.diagnosis.causes.length);
		expect(first.diagnosis.tests[0].steps.length).toBeGreaterThan(0);
		// Complaint matches are only suggestions until accepted.
		expect(first.suggestions.length).toBeGreaterThan(0);
		expect(first.answers.map((a: { key: string }) => a.key)).toEqual(['coolant_level']);

		const vehiclesBefore = await count('SELECT count(*) AS n FROM vehicles WHERE vin = ?', [VIN]);
		const second = await openCase(tech, { vehicle: { vin: VIN } });
		expect(second.case.vehicle.id).toBe(first.case.vehicle.id);
		expect(await count('SELECT count(*) AS n FROM vehicles WHERE vin = ?', [VIN])).toBe(
			vehiclesBefore
		);
		const byId = await openCase(tech, { vehicle: undefined, vehicleId: first.case.vehicle.id });
		expect(byId.case.vehicle.vin).toBe(VIN);
	});

	it('refuses a case without a vehicle, a bad VIN and an unknown observation, writing nothing', async () => {
		const before = await count('SELECT count(*) AS n FROM cases');
		const bodies: [unknown, string][] = [
			[{ complaint: 'hot' }, 'vehicle'],
			[{ vehicle: { vin: '1M8GDM9A1KP042788' } }, 'vehicle.vin'],
			[
				{ vehicle: { plate: 'AB1' }, observations: { engine_colour: 'blue' } },
				'observations.engine_colour'
			],
			[{ vehicle: { plate: 'AB1' }, odometer: { value: -5, unit: 'km' } }, 'odometer.value'],
			[{ vehicleId: 'no-such-vehicle' }, 'vehicleId']
		];
		for (const [body, path] of bodies) {
			const res = await tech.json('/api/v1/cases', body);
			expect(res.status).toBe(400);
			expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(path);
		}
		expect(await count('SELECT count(*) AS n FROM cases')).toBe(before);
	});

	it('lists by status and assignee and finds cases by VIN, plate or complaint words', async () => {
		const plate = `Q${Date.now() % 100000}`;
		const created = await openCase(tech, {
			vehicle: { plate, make: 'Harrow', model: 'Fen' },
			complaint: 'Coolant smells sweet inside the cabin on damp mornings'
		});
		const ids = async (query: string) => {
			const res = await tech.get(`/api/v1/cases?${query}`);
			expect(res.status).toBe(200);
			return ((await res.json()) as { cases: { id: string }[] }).cases.map((c) => c.id);
		};
		expect(await ids('status=open&assignee=me&limit=100')).toContain(created.case.id);
		expect(await ids('status=waiting,closed&limit=100')).not.toContain(created.case.id);
		expect(await ids(`q=${plate.toLowerCase()}`)).toEqual([created.case.id]);
		expect(await ids('q=damp%20SWEET&limit=100')).toContain(created.case.id);
		expect(await ids('q=damp%20dry&limit=100')).not.toContain(created.case.id);
		expect(await ids(`q=${VIN.slice(9)}&limit=100`)).not.toContain(created.case.id);
		const badStatus = await tech.get('/api/v1/cases?status=lost');
		expect(badStatus.status).toBe(400);
		expect(
			((await badStatus.json()) as { error: { issues: { path: string }[] } }).error.issues[0].path
		).toMatch(/^status/);
	});

	it('pages through every case of a shop exactly once with the cursor', async () => {
		const { client } = await createShop('Paging Lane Garage');
		const made = [];
		for (let i = 0; i < 23; i++)
			made.push((await openCase(client, { vehicle: { plate: `PG${i}` } })).case.id);
		const seen: string[] = [];
		let cursor: string | null = null;
		for (let page = 0; page < 10; page++) {
			const res = await client.get(`/api/v1/cases?limit=5${cursor ? `&cursor=${cursor}` : ''}`);
			const body = (await res.json()) as { cases: { id: string }[]; nextCursor: string | null };
			seen.push(...body.cases.map((c) => c.id));
			cursor = body.nextCursor;
			if (!cursor) break;
		}
		expect(seen).toHaveLength(23);
		expect(new Set(seen)).toEqual(new Set(made));
		const bad = await client.get('/api/v1/cases?cursor=not-a-cursor');
		expect(bad.status).toBe(400);
	});
});

describe('cases: the timeline', () => {
	it('appends an answer and answers with the stored event and the new ranking', async () => {
		const c = await openCase(tech);
		const res = await append(tech, c.case.id, 'answer_set', {
			key: 'fan_runs_when_hot',
			value: false
		});
		expect(res.status).toBe(201);
		expect(res.body.replayed).toBe(false);
		expect(res.body.event).toMatchObject({
			seq: 2,
			kind: 'answer_set',
			by: { name: 'Rowan Hale' }
		});
		expect(res.body.event.ranking).not.toEqual(c.timeline[0].ranking);
		expect(res.body.diagnosis.causes[0].probability).toBe(res.body.event.ranking[0].probability);
		const read = await tech.get(`/api/v1/cases/${c.case.id}`);
		const detail = (await read.json()) as { answers: unknown[]; timeline: unknown[] };
		expect(detail.answers).toContainEqual({
			key: 'fan_runs_when_hot',
			value: false,
			seq: 2,
			source: 'answer'
		});
		expect(detail.timeline).toHaveLength(2);
		const after = await tech.get(`/api/v1/cases/${c.case.id}/events?after=1`);
		const polled = (await after.json()) as { events: { seq: number }[]; lastSeq: number };
		expect(polled.events.map((e) => e.seq)).toEqual([2]);
		expect(polled.lastSeq).toBe(2);
	});

	it('two devices on one case: every answer is kept, in one server order, and the later one is current', async () => {
		const c = await openCase(tech);
		const values = ['full', 'low', 'empty'];
		const sent = await Promise.all(
			Array.from({ length: 12 }, (_, i) =>
				append(i % 2 ? lead : tech, c.case.id, 'answer_set', {
					key: 'coolant_level',
					value: values[i % 3]
				})
			)
		);
		expect(sent.map((r) => r.status)).toEqual(Array(12).fill(201));
		const seqs = sent.map((r) => r.body.event.seq).sort((a, b) => a - b);
		expect(seqs).toEqual(Array.from({ length: 12 }, (_, i) => i + 2));
		const last = sent.find((r) => r.body.event.seq === 13)!;
		const detail = (await (await tech.get(`/api/v1/cases/${c.case.id}`)).json()) as {
			answers: { key: string; value: string; seq: number }[];
			timeline: { by: { name: string } }[];
		};
		expect(detail.answers.find((a) => a.key === 'coolant_level')).toMatchObject({
			value: last.body.event.payload.value,
			seq: 13
		});
		// The answers kept on the row (for appends) are those derived from the events (for reads).
		const db = openServerDb();
		const [row] = (
			await db.execute({ sql: 'SELECT state, last_seq FROM cases WHERE id = ?', args: [c.case.id] })
		).rows;
		db.close();
		const kept = JSON.parse(String(row.state));
		expect(kept.seq).toBe(row.last_seq);
		expect(kept.answers).toEqual(detail.answers);
		const names = new Set(detail.timeline.slice(1).map((e) => e.by.name));
		expect(names).toEqual(new Set(['Rowan Hale', 'Ines Marlow']));
		expect(await eventCount(c.case.id)).toBe(13);
	});

	it('answers a replayed event id with the stored event and adds no row, even sent at once', async () => {
		const c = await openCase(tech);
		const id = randomUUID();
		const first = await append(
			tech,
			c.case.id,
			'answer_set',
			{ key: 'oil_milky', value: true },
			id
		);
		expect(first.status).toBe(201);
		const again = await append(
			tech,
			c.case.id,
			'answer_set',
			{ key: 'oil_milky', value: false },
			id
		);
		expect(again.status).toBe(200);
		expect(again.body.replayed).toBe(true);
		expect(again.body.event).toEqual(first.body.event);
		const burstId = randomUUID();
		const burst = await Promise.all(
			Array.from({ length: 6 }, () =>
				append(lead, c.case.id, 'not_sure', { key: 'sweet_smell' }, burstId)
			)
		);
		expect(burst.filter((r) => r.status === 201)).toHaveLength(1);
		expect(burst.every((r) => r.body.event.seq === burst[0].body.event.seq)).toBe(true);
		expect(
			await count(
				'SELECT count(*) AS n FROM case_events WHERE case_id = ? AND client_event_id IN (?, ?)',
				[c.case.id, id, burstId]
			)
		).toBe(2);
		expect(await eventCount(c.case.id)).toBe(3);
	});

	it('refuses an unknown key, a wrong value, an unknown test or step with 400 and the path, writing nothing', async () => {
		const c = await openCase(tech);
		const bad: [string, unknown, string][] = [
			['answer_set', { key: 'engine_colour', value: 'blue' }, 'payload.key'],
			['answer_set', { key: 'fan_runs_when_hot', value: 'yes' }, 'payload.value'],
			['answer_set', { key: 'loss_l_per_week', value: 500 }, 'payload.value'],
			['answer_set', { key: 'coolant_level' }, 'payload.value'],
			['not_sure', { key: 'nope' }, 'payload.key'],
			[
				'test_step_ticked',
				{ test: 'cooling_system_pressure_test', step: 40, done: true },
				'payload.step'
			],
			['test_result_recorded', { test: 'no_such_test', value: 'holds' }, 'payload.test'],
			[
				'test_result_recorded',
				{ test: 'cooling_system_pressure_test', value: 'leaks' },
				'payload.value'
			],
			['complaint_match_accepted', { key: 'oil_milky', value: true }, 'payload'],
			['case_taken', {}, 'kind']
		];
		for (const [kind, payload, path] of bad) {
			const res = await append(tech, c.case.id, kind, payload);
			expect(res.status, `${kind} ${JSON.stringify(payload)}`).toBe(400);
			expect(res.body.error.code).toBe('invalid_request');
			expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(path);
		}
		const badId = await tech.json(`/api/v1/cases/${c.case.id}/events`, {
			id: 'x',
			kind: 'note',
			payload: { text: 'hello' }
		});
		expect(badId.body.error.issues[0].path).toBe('id');
		expect(await eventCount(c.case.id)).toBe(1);
	});

	it('accepts one complaint match as an answer with its words and rejects another', async () => {
		const c = await openCase(tech, {
			complaint: 'gets hot sitting in traffic and there is a sweet smell in the cabin'
		});
		const [accept, reject] = c.suggestions as { key: string; value: unknown; from: string }[];
		expect(reject).toBeDefined();
		const ok = await append(tech, c.case.id, 'complaint_match_accepted', {
			key: accept.key,
			value: accept.value
		});
		expect(ok.status).toBe(201);
		expect(ok.body.event.payload.from).toBe(accept.from);
		await append(tech, c.case.id, 'complaint_match_rejected', {
			key: reject.key,
			value: reject.value
		});
		const detail = (await (await tech.get(`/api/v1/cases/${c.case.id}`)).json()) as {
			answers: { key: string; source: string; from?: string }[];
			suggestions: { key: string }[];
		};
		expect(detail.answers).toContainEqual(
			expect.objectContaining({ key: accept.key, source: 'complaint', from: accept.from })
		);
		expect(detail.answers.map((a) => a.key)).not.toContain(reject.key);
		expect(detail.suggestions.map((s) => s.key)).not.toContain(accept.key);
		expect(detail.suggestions.map((s) => s.key)).not.toContain(reject.key);
	});

	it('keeps ticked steps and turns a test result into an answer that re-ranks', async () => {
		const c = await openCase(tech);
		const test = 'cooling_system_pressure_test';
		await append(tech, c.case.id, 'test_step_ticked', { test, step: 0, done: true });
		await append(tech, c.case.id, 'test_step_ticked', { test, step: 2, done: true });
		const result = await append(tech, c.case.id, 'test_result_recorded', {
			test,
			value: 'drops_no_visible_leak'
		});
		expect(result.status).toBe(201);
		expect(result.body.event.payload).toEqual({
			test,
			key: 'pressure_test',
			value: 'drops_no_visible_leak'
		});
		expect(result.body.diagnosis.tests.map((t: { key: string }) => t.key)).not.toContain(test);
		const detail = (await (await tech.get(`/api/v1/cases/${c.case.id}`)).json()) as {
			ticks: Record<string, number[]>;
			answers: { key: string; source: string }[];
		};
		expect(detail.ticks[test]).toEqual([0, 2]);
		expect(detail.answers).toContainEqual(
			expect.objectContaining({ key: 'pressure_test', source: 'test' })
		);
	});
});

describe('cases: status and taking', () => {
	it('409 for an event on a waiting case; a technician takes it and then it takes events', async () => {
		const c = await openCase(lead, { status: 'waiting' });
		expect(c.case.assignee).toBeNull();
		const early = await append(tech, c.case.id, 'note', { text: 'looked at it' });
		expect(early.status).toBe(409);
		expect(early.body.error.code).toBe('conflict');
		expect(await eventCount(c.case.id)).toBe(1);
		const taken = await tech.json(`/api/v1/cases/${c.case.id}/take`, {});
		expect(taken.status).toBe(200);
		expect(taken.body.case).toMatchObject({ status: 'open', assignee: { name: 'Rowan Hale' } });
		expect(taken.body.timeline.at(-1).kind).toBe('case_taken');
		expect((await lead.json(`/api/v1/cases/${c.case.id}/take`, {})).status).toBe(409);
		expect((await append(tech, c.case.id, 'note', { text: 'on the lift' })).status).toBe(201);
	});

	it('two technicians taking one case at once: one gets it', async () => {
		const c = await openCase(lead, { status: 'waiting' });
		const [a, b] = await Promise.all([
			tech.json(`/api/v1/cases/${c.case.id}/take`, {}),
			lead.json(`/api/v1/cases/${c.case.id}/take`, {})
		]);
		expect([a.status, b.status].sort()).toEqual([200, 409]);
		expect(await eventCount(c.case.id)).toBe(2);
	});

	it('409 for an event on a closed case', async () => {
		const c = await openCase(tech);
		const db = openServerDb();
		await db.execute({ sql: "UPDATE cases SET status = 'closed' WHERE id = ?", args: [c.case.id] });
		db.close();
		const res = await append(tech, c.case.id, 'answer_set', { key: 'oil_milky', value: true });
		expect(res.status).toBe(409);
		expect(await eventCount(c.case.id)).toBe(1);
	});
});

describe('cases: who may', () => {
	it('another shop’s case is 404 on every case endpoint, with nothing written', async () => {
		const c = await openCase(tech, { status: 'waiting' });
		const { client: other } = await createShop('Far Shore Garage');
		const before = await eventCount(c.case.id);
		const base = `/api/v1/cases/${c.case.id}`;
		const answers = [
			await other.get(base),
			await other.get(`${base}/events`),
			await other.json(`${base}/events`, {
				id: randomUUID(),
				kind: 'note',
				payload: { text: 'x' }
			}),
			await other.json(`${base}/take`, {})
		];
		for (const res of answers) expect(res.status).toBe(404);
		const list = (await (await other.get('/api/v1/cases?limit=100')).json()) as {
			cases: unknown[];
		};
		expect(list.cases).toEqual([]);
		expect(await eventCount(c.case.id)).toBe(before);
		const row = await count("SELECT count(*) AS n FROM cases WHERE id = ? AND status = 'waiting'", [
			c.case.id
		]);
		expect(row).toBe(1);
	});

	it('a manager reads cases but may not open or change one; an intake key may not read them', async () => {
		const manager = newClient();
		await manager.signIn(DEMO.manager, DEMO_PASSWORD);
		const c = await openCase(tech);
		expect((await manager.get(`/api/v1/cases/${c.case.id}`)).status).toBe(200);
		expect((await manager.json('/api/v1/cases', { vehicle: { plate: 'M1' } })).status).toBe(403);
		expect((await append(manager, c.case.id, 'note', { text: 'x' })).status).toBe(403);
		const byKey = await newClient().get('/api/v1/cases', {
			headers: { authorization: `Bearer ${DEMO_API_KEY}` }
		});
		expect(byKey.status).toBe(403);
		expect((await newClient().get('/api/v1/cases')).status).toBe(401);
		expect(await eventCount(c.case.id)).toBe(1);
	});
});

describe('intake through the diagnose API reaches the bay', () => {
	it('saveAsCase opens a waiting case with the customer’s words and the first ranking', async () => {
		const res = await newClient().json(
			'/api/v1/diagnose',
			{
				observations: { temp_gauge: 'high_at_idle' },
				complaint: 'the fan never seems to come on',
				vehicle: { vin: VIN, odometerKm: 90_500 },
				saveAsCase: true
			},
			{ authorization: `Bearer ${DEMO_API_KEY}` }
		);
		expect(res.status).toBe(200);
		const detail = (await (await tech.get(`/api/v1/cases/${res.body.caseId}`)).json()) as {
			case: Record<string, unknown> & { vehicle: { vin: string } };
			answers: { key: string }[];
			timeline: { kind: string; payload: Record<string, unknown>; ranking: unknown[] }[];
		};
		expect(detail.case).toMatchObject({
			status: 'waiting',
			source: 'api',
			complaint: 'the fan never seems to come on',
			odometer: { value: 90_500, unit: 'km' }
		});
		expect(detail.case.vehicle.vin).toBe(VIN);
		expect(detail.answers.map((a) => a.key)).toEqual(['temp_gauge']);
		expect(detail.timeline).toHaveLength(1);
		expect(detail.timeline[0]).toMatchObject({
			kind: 'case_opened',
			payload: { complaint: 'the fan never seems to come on' }
		});
		expect(detail.timeline[0].ranking.length).toBeGreaterThan(0);
		const queue = (await (await tech.get('/api/v1/cases?status=waiting&limit=100')).json()) as {
			cases: { id: string }[];
		};
		expect(queue.cases.map((c) => c.id)).toContain(res.body.caseId);
	});
});

describe('rescoring on a newer edition', () => {
	it('is an explicit recorded event; the case keeps its edition until then', async () => {
		const { client } = await createShop('Rescore Row Garage');
		const c = await openCase(client);
		const db = openServerDb();
		await db.execute({
			sql: `INSERT INTO rulebook_editions (id, shop_id, number, status, content, published_at)
				SELECT 'rescore-2-' || shop_id, shop_id, 2, 'published', content, unixepoch()
				FROM rulebook_editions WHERE shop_id = (SELECT shop_id FROM cases WHERE id = ?) AND number = 1`,
			args: [c.case.id]
		});
		db.close();
		const before = (await (await client.get(`/api/v1/cases/${c.case.id}`)).json()) as {
			case: { edition: { number: number }; newerEdition: { number: number } | null };
		};
		expect(before.case.edition.number).toBe(1);
		expect(before.case.newerEdition).toEqual({ number: 2 });
		expect((await append(client, c.case.id, 'rescored', { toEdition: 3 })).status).toBe(409);
		const res = await append(client, c.case.id, 'rescored', { toEdition: 2 });
		expect(res.status).toBe(201);
		expect(res.body.event).toMatchObject({
			kind: 'rescored',
			edition: 2,
			payload: { fromEdition: 1, toEdition: 2 }
		});
		const after = (await (await client.get(`/api/v1/cases/${c.case.id}`)).json()) as typeof before;
		expect(after.case.edition.number).toBe(2);
		expect(after.case.newerEdition).toBeNull();
		expect((await append(client, c.case.id, 'rescored', { toEdition: 2 })).status).toBe(409);
	});
});

describe('the case API in OpenAPI', () => {
	it('publishes every case path with its schemas, and every reference resolves', async () => {
		const doc = await (await newClient().get('/api/v1/openapi.json')).json();
		expect(Object.keys(doc.paths)).toEqual(
			expect.arrayContaining([
				'/api/v1/cases',
				'/api/v1/cases/{id}',
				'/api/v1/cases/{id}/events',
				'/api/v1/cases/{id}/take'
			])
		);
		expect(doc.paths['/api/v1/cases/{id}/events'].post.responses).toHaveProperty('409');
		const text = JSON.stringify(doc);
		const refs = [...text.matchAll(/"\$ref":"#\/components\/schemas\/([^"]+)"/g)].map((m) => m[1]);
		expect(refs.filter((name) => !doc.components.schemas[name])).toEqual([]);
		expect(JSON.stringify(doc.components.schemas.AppendEvent)).toContain('test_result_recorded');
	});
});
