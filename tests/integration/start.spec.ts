import { spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Client } from '../support/client';
import { freePort, startServer } from '../support/server';
import { waitForLink } from '../support/smtp-catcher';

describe('start-up and demo seeding', () => {
	it('refuses to seed demo users under NODE_ENV=production unless asked explicitly', async () => {
		const server = await startServer({
			name: 'prod-refuse',
			env: { NODE_ENV: 'production', CAUSEWAY_SEED_DEMO: '1' }
		});
		try {
			expect(server.output()).toContain('not seeding demo users because NODE_ENV=production');
			const res = await new Client(server.baseUrl).action('/signin', {
				email: 'tech@saltmarsh.example',
				password: 'causeway-demo-2026'
			});
			expect(res.status).toBe(400);
		} finally {
			await server.stop();
		}
	});

	it('seeds them in production when explicitly allowed, and marks the session cookie Secure', async () => {
		const server = await startServer({
			name: 'prod-allow',
			env: {
				NODE_ENV: 'production',
				CAUSEWAY_SEED_DEMO: '1',
				CAUSEWAY_ALLOW_DEMO_IN_PRODUCTION: '1',
				DEMO_PASSWORD: 'explicit-demo-password-1'
			}
		});
		try {
			const res = await fetch(`${server.baseUrl}/signin`, {
				method: 'POST',
				redirect: 'manual',
				headers: {
					origin: server.baseUrl,
					accept: 'text/html',
					'content-type': 'application/x-www-form-urlencoded'
				},
				body: new URLSearchParams({
					email: 'lead@saltmarsh.example',
					password: 'explicit-demo-password-1'
				}).toString()
			});
			expect(res.status).toBe(303);
			expect(res.headers.getSetCookie().join(';')).toMatch(/causeway_session=[^;]+;.*Secure/i);

			// Without SMTP_URL, mail is written to MAIL_DIR as .eml files a mail client can open.
			const reset = await new Client(server.baseUrl).action('/reset', {
				email: 'lead@saltmarsh.example'
			});
			expect(reset.type).toBe('success');
			const link = await waitForLink(
				join(server.dataDir, 'mail-out'),
				'lead@saltmarsh.example',
				'/reset/'
			);
			expect(link.startsWith(`${server.baseUrl}/reset/`)).toBe(true);
		} finally {
			await server.stop();
		}
	});

	it('npm start serves the demo shop on PORT with the documented local password', async () => {
		const port = await freePort();
		const dir = mkdtempSync(join(tmpdir(), 'causeway-start-'));
		const child = spawn(process.execPath, ['scripts/start.js'], {
			env: {
				...process.env,
				PORT: String(port),
				DATABASE_URL: `file:${join(dir, 'data', 'causeway.db')}`,
				MAIL_DIR: join(dir, 'mail'),
				NODE_ENV: ''
			},
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let output = '';
		child.stdout.on('data', (d) => (output += d));
		child.stderr.on('data', (d) => (output += d));
		try {
			const baseUrl = `http://localhost:${port}`;
			for (let i = 0; i < 600 && !output.includes('Listening on'); i++)
				await new Promise((r) => setTimeout(r, 100));
			expect(output).toContain('seeded the demo shop "Saltmarsh Lane Garage"');
			expect(output).toMatch(/Intake API key \(shown once\): cw_[a-z0-9]+/);
			const client = new Client(baseUrl);
			await client.signIn('admin@saltmarsh.example', 'causeway-demo-2026');
			const home = await client.get('/');
			expect(await home.text()).toContain('Saltmarsh Lane Garage');
		} finally {
			child.kill('SIGTERM');
		}
	}, 120_000);
});
