import { request as httpRequest } from 'node:http';
import { describe, expect, it } from 'vitest';
import { DEMO, DEMO_API_KEY, DEMO_PASSWORD, baseUrl, newClient, openServerDb } from './helpers';
import { actionPath, listFormActions } from './route-tree';

// The HTTP boundary: every API error is the contract's JSON (contract/api.md, "Errors"), and no
// form post that an action cannot read is a 500.

const KEY = { authorization: `Bearer ${DEMO_API_KEY}` };

/** A body sent in chunks with no Content-Length, the way a streaming client sends it. */
function postChunked(path: string, chunks: number, chunkBytes: number) {
	return new Promise<{ status: number; body: string }>((resolve, reject) => {
		const req = httpRequest(`${baseUrl()}${path}`, {
			method: 'POST',
			headers: { ...KEY, 'content-type': 'application/json', 'transfer-encoding': 'chunked' }
		});
		req.on('response', (res) => {
			let body = '';
			res.on('data', (chunk) => (body += chunk));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
		});
		req.on('error', reject);
		const chunk = Buffer.alloc(chunkBytes, 0x20);
		let sent = 0;
		const write = () => {
			while (sent < chunks) {
				sent++;
				if (!req.write(chunk)) return req.once('drain', write);
			}
			req.end();
		};
		write();
	});
}

describe('the JSON API answers every error in the contract shape', () => {
	it('answers a chunked body over the limit with 413 too_large instead of closing the socket', async () => {
		const res = await postChunked('/api/v1/diagnose', 100, 1024); // 100 KiB, limit 64 KiB
		expect(res.status).toBe(413);
		expect(JSON.parse(res.body).error.code).toBe('too_large');
	});

	it('answers a method a v1 path does not have with a JSON 405 and Allow', async () => {
		const cases: [string, string, string][] = [
			['GET', '/api/v1/diagnose', 'POST'],
			['PUT', '/api/v1/diagnose', 'POST'],
			['DELETE', '/api/v1/calculators', 'GET'],
			['PUT', '/api/v1/calculators/freeze-point', 'GET'],
			['DELETE', '/api/v1/openapi.json', 'GET']
		];
		for (const [method, path, allowed] of cases) {
			const res = await fetch(`${baseUrl()}${path}`, { method, headers: KEY });
			expect(res.status, `${method} ${path}`).toBe(405);
			expect(res.headers.get('content-type')).toBe('application/json');
			expect(res.headers.get('allow')).toContain(allowed);
			const body = await res.json();
			expect(body.error.code).toBe('method_not_allowed');
			expect(body.error.message).toContain(method);
		}
	});

	it('answers a malformed percent-encoding in a v1 path with a JSON 400', async () => {
		const res = await fetch(`${baseUrl()}/api/v1/calculators/%E0%A4%A`, { headers: KEY });
		expect(res.status).toBe(400);
		expect(res.headers.get('content-type')).toBe('application/json');
		expect((await res.json()).error.code).toBe('invalid_request');
	});

	it('answers a path under /api/v1 that does not exist with a JSON 404', async () => {
		const res = await fetch(`${baseUrl()}/api/v1/no-such-thing`, { headers: KEY });
		expect(res.status).toBe(404);
		expect((await res.json()).error.code).toBe('not_found');
	});

	it('refuses a body sent as XML with a JSON 415', async () => {
		const res = await fetch(`${baseUrl()}/api/v1/diagnose`, {
			method: 'POST',
			headers: { ...KEY, 'content-type': 'application/xml' },
			body: '<observations/>'
		});
		expect(res.status).toBe(415);
		expect((await res.json()).error.code).toBe('unsupported_media_type');
	});
});

describe('saveAsCase needs the right to work cases', () => {
	const countCases = async () => {
		const db = openServerDb();
		try {
			return Number((await db.execute('select count(*) as n from cases')).rows[0].n);
		} finally {
			db.close();
		}
	};

	it('refuses a manager 403 and writes no case; a technician and an intake key open one', async () => {
		const body = { observations: { coolant_level: 'low' }, saveAsCase: true };
		const manager = newClient();
		await manager.signIn(DEMO.manager, DEMO_PASSWORD);
		const before = await countCases();
		const refused = await manager.json('/api/v1/diagnose', body);
		expect(refused.status).toBe(403);
		expect(refused.body.error.code).toBe('forbidden');
		expect(await countCases()).toBe(before);
		// Without saveAsCase the manager may still rank causes (diagnose:use).
		expect((await manager.json('/api/v1/diagnose', { ...body, saveAsCase: false })).status).toBe(
			200
		);

		const technician = newClient();
		await technician.signIn(DEMO.technician, DEMO_PASSWORD);
		const byTechnician = await technician.json('/api/v1/diagnose', body);
		expect(byTechnician.status).toBe(200);
		expect(typeof byTechnician.body.caseId).toBe('string');
		const byKey = await newClient().json('/api/v1/diagnose', body, KEY);
		expect(byKey.status).toBe(200);
		expect(typeof byKey.body.caseId).toBe('string');
		expect(await countCases()).toBe(before + 2);
	});
});

describe('form posts that no action can read', () => {
	const brokenMultipart = '--xyz\r\nContent-Disposition: form-data; name="email"\r\n\r\nabc';

	it('answers a broken multipart body on every form action with a 4xx, not a 500', async () => {
		const admin = newClient();
		await admin.signIn(DEMO.admin, DEMO_PASSWORD);
		const actions = listFormActions();
		expect(actions.length).toBeGreaterThan(10);
		for (const { route, action } of actions) {
			const path = actionPath(route.replace(/\[[^\]]+\]/g, 'x'), action);
			for (const enhanced of [true, false]) {
				const res = await admin.request(path, {
					method: 'POST',
					headers: {
						origin: baseUrl(),
						'content-type': 'multipart/form-data; boundary=xyz',
						...(enhanced ? { accept: 'application/json', 'x-sveltekit-action': 'true' } : {})
					},
					body: brokenMultipart
				});
				const text = await res.text();
				expect(res.status, `${path} (${enhanced ? 'enhanced' : 'plain'})`).toBe(400);
				if (enhanced) expect(JSON.parse(text)).toMatchObject({ type: 'error' });
			}
		}
	});

	it('answers a text/plain post to an action with 415', async () => {
		const res = await newClient().request('/signin', {
			method: 'POST',
			headers: { origin: baseUrl(), 'content-type': 'text/plain' },
			body: 'email=a@b.example'
		});
		expect(res.status).toBe(415);
	});

	it('answers a post to ?/default of a page with named actions as no such action (404)', async () => {
		const anonymous = newClient();
		const res = await anonymous.action('/signin?/default', {
			email: DEMO.technician,
			password: DEMO_PASSWORD
		});
		expect(res.httpStatus).toBe(404);
		expect(res.type).toBe('error');
		expect(anonymous.cookies.size).toBe(0); // nothing signed in
	});

	it('answers a file in a text field of the shop settings with the form message, values without the file', async () => {
		const admin = newClient();
		await admin.signIn(DEMO.admin, DEMO_PASSWORD);
		const form = new FormData();
		form.append('name', new Blob(['not a name']), 'name.txt');
		form.append('firstChangeKm', '160000');
		form.append('thenEveryKm', '80000');
		form.append('everyMonths', '60');
		const res = await admin.request('/settings/shop?/save', {
			method: 'POST',
			headers: { origin: baseUrl(), accept: 'application/json', 'x-sveltekit-action': 'true' },
			body: form
		});
		expect(res.status).toBe(200); // the action protocol carries the form's 400 inside
		const result = (await res.json()) as { type: string; status: number; data: string };
		expect(result.type).toBe('failure');
		expect(result.status).toBe(400);
		expect(result.data).toContain('firstChangeKm');
		expect(result.data).not.toContain('not a name');
	});
});
