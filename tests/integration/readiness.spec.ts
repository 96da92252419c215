import { execFileSync, spawn } from 'node:child_process';
import { chmodSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { freePort, startServer } from '../support/server';
import { newClient, openServerDb } from './helpers';

const isRoot = process.getuid?.() === 0;

/** Makes `dir` read-only: a read-only bind mount as root (root ignores file modes), else chmod. */
function makeReadOnly(dir: string): () => void {
	if (!isRoot) {
		chmodSync(dir, 0o555);
		return () => chmodSync(dir, 0o755);
	}
	execFileSync('mount', ['--bind', dir, dir]);
	execFileSync('mount', ['-o', 'remount,bind,ro', dir]);
	return () => execFileSync('umount', [dir]);
}

/** Runs `node build` until it exits (at most 30 s) and returns its code and output. */
async function runUntilExit(env: Record<string, string>) {
	const port = await freePort();
	return new Promise<{ code: number | null; output: string }>((done) => {
		const child = spawn(process.execPath, ['build'], {
			env: { ...process.env, NODE_ENV: 'test', PORT: String(port), HOST: '127.0.0.1', ...env },
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let output = '';
		child.stdout.on('data', (d) => (output += d));
		child.stderr.on('data', (d) => (output += d));
		const timer = setTimeout(() => child.kill('SIGKILL'), 30_000);
		child.on('exit', (code) => {
			clearTimeout(timer);
			done({ code, output });
		});
	});
}

const dataVersion = async (db: ReturnType<typeof openServerDb>) =>
	Number((await db.execute('PRAGMA data_version')).rows[0].data_version);

describe('health and readiness', () => {
	it('answers /api/ready after a committed write, while /api/health only reads', async () => {
		const db = openServerDb();
		const client = newClient();
		const before = await dataVersion(db);
		for (let i = 0; i < 5; i++) expect((await client.get('/api/health')).status).toBe(200);
		// data_version changes when another connection commits (sqlite.org/pragma.html#pragma_data_version).
		expect(await dataVersion(db)).toBe(before);
		const ready = await client.get('/api/ready');
		expect(ready.status).toBe(200);
		expect(await ready.json()).toEqual({ ok: true });
		expect(await dataVersion(db)).not.toBe(before);
		db.close();
	});

	it.skipIf(!isRoot)(
		'answers /api/ready 503 on a full disk while /api/health still says 200',
		async () => {
			const dir = resolve('tests/.tmp', `full-disk-${process.pid}-${Date.now()}`);
			mkdirSync(dir, { recursive: true });
			execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=4m', 'tmpfs', dir]);
			const server = await startServer({
				name: 'full-disk',
				env: { DATABASE_URL: `file:${join(dir, 'causeway.db')}` }
			}).catch(async (error) => {
				execFileSync('umount', [dir]);
				throw error;
			});
			try {
				expect((await fetch(`${server.baseUrl}/api/ready`)).status).toBe(200);
				// Fill what is left of the disk.
				try {
					for (let i = 0; i < 64; i++)
						writeFileSync(join(dir, `filler-${i}`), Buffer.alloc(256 * 1024));
				} catch (error) {
					expect((error as NodeJS.ErrnoException).code).toBe('ENOSPC');
				}
				expect((await fetch(`${server.baseUrl}/api/health`)).status).toBe(200);
				const ready = await fetch(`${server.baseUrl}/api/ready`);
				expect(ready.status).toBe(503);
				expect((await ready.json()).error.code).toBe('unavailable');
			} finally {
				await server.stop();
				execFileSync('umount', [dir]);
				rmSync(dir, { recursive: true, force: true });
			}
		}
	);
});

describe('starting on a folder that cannot be written', () => {
	const cases = [
		['an empty read-only folder', false],
		['a read-only folder that holds the database', true]
	] as const;
	it.each(cases)('stops on %s with one clear line and a non-zero exit', async (_, withDatabase) => {
		const dir = resolve('tests/.tmp', `read-only-${process.pid}-${Date.now()}`);
		mkdirSync(dir, { recursive: true });
		const url = `file:${join(dir, 'causeway.db')}`;
		if (withDatabase) {
			const first = await startServer({ name: 'read-only-first', env: { DATABASE_URL: url } });
			await first.stop();
		}
		const restore = makeReadOnly(dir);
		try {
			const { code, output } = await runUntilExit({ DATABASE_URL: url });
			expect(code).not.toBe(0);
			const lines = output.trim().split('\n');
			expect(lines).toHaveLength(1);
			expect(lines[0]).toMatch(/^Causeway cannot start: /);
			expect(lines[0]).toContain(`DATABASE_URL=${url}`);
			expect(output).not.toMatch(/\n\s+at /);
		} finally {
			restore();
			rmSync(dir, { recursive: true, force: true });
		}
	});
});
