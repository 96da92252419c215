import { beforeAll, describe, expect, it } from 'vitest';
import type { Client } from '../support/client';
import { createShop, DEMO, DEMO_PASSWORD, newClient, openServerDb } from './helpers';

type Role = keyof typeof DEMO;
const ROLES: Role[] = ['technician', 'lead', 'manager', 'admin'];

/** Who may open which page (design.md, "Users and roles"); everyone else gets 403. */
const PAGES: Record<string, Role[]> = {
	'/': ROLES,
	'/rank': ROLES,
	'/calculators': ROLES,
	'/rulebook': ['lead', 'manager', 'admin'],
	'/settings/users': ['manager', 'admin'],
	'/settings/api-keys': ['manager', 'admin'],
	'/settings/audit': ['manager', 'admin'],
	'/settings/shop': ['admin']
};

/** Form actions with a harmless but valid body; a refused role must change nothing. */
const ACTIONS: { path: string; fields: Record<string, string>; allowed: Role[] }[] = [
	{
		path: '/settings/users?/invite',
		fields: { email: 'x', role: 'technician' },
		allowed: ['manager', 'admin']
	},
	{
		path: '/settings/users?/changeRole',
		fields: { userId: 'x', role: 'lead' },
		allowed: ['manager', 'admin']
	},
	{ path: '/settings/api-keys?/create', fields: { name: '' }, allowed: ['manager', 'admin'] },
	{ path: '/settings/api-keys?/revoke', fields: { keyId: '' }, allowed: ['manager', 'admin'] },
	{ path: '/settings/shop?/save', fields: { name: '' }, allowed: ['admin'] }
];

const clients = {} as Record<Role, Client>;

beforeAll(async () => {
	for (const role of ROLES) {
		clients[role] = newClient();
		await clients[role].signIn(DEMO[role], DEMO_PASSWORD);
	}
});

describe('role × page matrix', () => {
	for (const [path, allowed] of Object.entries(PAGES)) {
		it(`${path}: signed-out visitors are sent to sign in`, async () => {
			const res = await newClient().get(path);
			expect(res.status).toBe(303);
			expect(res.headers.get('location')).toBe(`/signin?next=${encodeURIComponent(path)}`);
		});
		for (const role of ROLES) {
			const expected = allowed.includes(role) ? 200 : 403;
			it(`${path}: ${role} gets ${expected}`, async () => {
				const res = await clients[role].get(path);
				expect(res.status).toBe(expected);
			});
		}
	}
});

describe('role × action matrix', () => {
	for (const action of ACTIONS) {
		for (const role of ROLES) {
			const allowed = action.allowed.includes(role);
			it(`${action.path}: ${role} is ${allowed ? 'let through to validation' : 'refused with 403'}`, async () => {
				const res = await clients[role].action(action.path, action.fields);
				// Allowed roles reach the form validation (400) or lookup (404); refused roles get 403.
				if (allowed) expect([400, 404]).toContain(res.status);
				else expect(res.status).toBe(403);
			});
		}
		it(`${action.path}: a signed-out post is sent to sign in`, async () => {
			const res = await newClient().action(action.path, action.fields);
			expect(res.type).toBe('redirect');
			expect(res.location).toMatch(/^\/signin/);
		});
	}
});

describe('role × API matrix', () => {
	for (const role of ROLES) {
		it(`POST /api/v1/diagnose with a ${role}'s session gets 200`, async () => {
			const res = await clients[role].json('/api/v1/diagnose', { observations: {} });
			expect(res.status).toBe(200);
		});
	}
	const CASE_WRITERS: Role[] = ['technician', 'lead', 'admin'];
	for (const role of ROLES) {
		it(`GET /api/v1/cases with a ${role}'s session gets 200`, async () => {
			expect((await clients[role].get('/api/v1/cases?limit=1')).status).toBe(200);
		});
		const writes = CASE_WRITERS.includes(role);
		it(`case writes with a ${role}'s session are ${writes ? 'let through to validation' : 'refused with 403'}`, async () => {
			const [demoCase] = (await (await clients.technician.get('/api/v1/cases?limit=1')).json())
				.cases as { id: string }[];
			const base = `/api/v1/cases/${demoCase.id}`;
			// A body that fails the schema: allowed roles get 400, refused roles 403 before it is read.
			const statuses = [
				(await clients[role].json('/api/v1/cases', { vehicle: {} })).status,
				(await clients[role].json(`${base}/events`, { id: 'x' })).status,
				(await clients[role].json(`${base}/take`, { id: 'x' })).status
			];
			expect(statuses).toEqual(Array(3).fill(writes ? 400 : 403));
		});
	}
	it('the case API without a session gets 401; the hosted intake form needs no sign-in', async () => {
		expect((await newClient().get('/api/v1/cases')).status).toBe(401);
		expect((await newClient().json('/api/v1/cases', {})).status).toBe(401);
		expect((await newClient().get('/intake/saltmarsh-lane')).status).toBe(200);
	});
	it('POST /api/v1/diagnose without a session or key gets 401 in the contract shape', async () => {
		const res = await newClient().json('/api/v1/diagnose', { observations: {} });
		expect(res.status).toBe(401);
		expect(res.body.error.code).toBe('unauthenticated');
	});
});

describe('one shop never reaches another shop’s data', () => {
	it('answers 404, not 403, for another shop’s user and key ids, and changes nothing', async () => {
		const db = openServerDb();
		const demoUser = await db.execute({
			sql: 'SELECT id, role FROM users WHERE email = ?',
			args: [DEMO.technician]
		});
		const demoKey = await db.execute(
			'SELECT k.id FROM api_keys k JOIN shops s ON s.id = k.shop_id WHERE s.is_demo = 1 AND k.revoked_at IS NULL LIMIT 1'
		);
		const { client } = await createShop('Other Side Garage');
		const role = await client.action('/settings/users?/changeRole', {
			userId: String(demoUser.rows[0].id),
			role: 'lead'
		});
		expect(role.status).toBe(404);
		const deactivate = await client.action('/settings/users?/setActive', {
			userId: String(demoUser.rows[0].id),
			active: 'false'
		});
		expect(deactivate.status).toBe(404);
		const revoke = await client.action('/settings/api-keys?/revoke', {
			keyId: String(demoKey.rows[0].id)
		});
		expect(revoke.status).toBe(404);

		const after = await db.execute({
			sql: 'SELECT role, active FROM users WHERE email = ?',
			args: [DEMO.technician]
		});
		expect(after.rows[0].role).toBe(demoUser.rows[0].role);
		expect(after.rows[0].active).toBe(1);
		const key = await db.execute({
			sql: 'SELECT revoked_at FROM api_keys WHERE id = ?',
			args: [String(demoKey.rows[0].id)]
		});
		expect(key.rows[0].revoked_at).toBeNull();
		db.close();
	});

	it('lists only the caller’s own shop on the team and key pages', async () => {
		const { client } = await createShop('Lone Pine Garage');
		const team = await (await client.get('/settings/users')).text();
		expect(team).not.toContain(DEMO.technician);
		const keys = await (await client.get('/settings/api-keys')).text();
		expect(keys).not.toContain('Demo intake form');
	});
});
