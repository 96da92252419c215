import { describe, expect, it } from 'vitest';
import { startServer } from '../support/server';
import { createShop, newClient } from './helpers';

describe('security headers', () => {
	it('sends a Content-Security-Policy whose nonce is the one on the page scripts', async () => {
		const res = await newClient().get('/signin');
		const csp = res.headers.get('content-security-policy') ?? '';
		expect(csp).toContain("default-src 'self'");
		expect(csp).toContain("object-src 'none'");
		expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
		const nonce = /script-src[^;]*'nonce-([^']+)'/.exec(csp)?.[1];
		expect(nonce).toBeTruthy();
		const html = await res.text();
		const scripts = [...html.matchAll(/<script(?![^>]*\ssrc=)([^>]*)>/g)];
		expect(scripts.length).toBeGreaterThan(0);
		for (const [, attrs] of scripts) expect(attrs).toContain(`nonce="${nonce}"`);
	});

	it('keeps signed-in pages and their data out of caches, and not public pages', async () => {
		const { client } = await createShop();
		for (const path of ['/', '/settings/users', '/settings/users/__data.json']) {
			const res = await client.get(path);
			expect(res.status, path).toBe(200);
			expect(res.headers.get('cache-control'), path).toBe('no-store');
		}
		const anon = await newClient().get('/signin');
		expect(anon.headers.get('cache-control')).not.toBe('no-store');
	});

	it('marks the sign-in answer that sets the session cookie no-store', async () => {
		const { email, password } = await createShop();
		const res = await newClient().action('/signin', { email, password });
		expect(res.type).toBe('redirect');
		const raw = await newClient().postForm('/signin', { email, password });
		expect(raw.status).toBe(303);
		expect(raw.headers.get('cache-control')).toBe('no-store');
	});

	it('sends HSTS in production only', async () => {
		expect((await newClient().get('/signin')).headers.get('strict-transport-security')).toBeNull();
		const server = await startServer({ name: 'hsts', env: { NODE_ENV: 'production' } });
		try {
			const res = await fetch(`${server.baseUrl}/signin`);
			expect(res.headers.get('strict-transport-security')).toMatch(/^max-age=31536000/);
		} finally {
			await server.stop();
		}
	});
});
