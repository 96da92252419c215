import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { join, resolve } from 'node:path';

export async function freePort(): Promise<number> {
	return new Promise((resolvePort, reject) => {
		const server = createServer();
		server.unref();
		server.on('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolvePort(port));
		});
	});
}

export type RunningServer = {
	baseUrl: string;
	/** Process id of the server (the benchmark reads its CPU time). */
	pid: number;
	dataDir: string;
	stop: () => Promise<void>;
	output: () => string;
};

/**
 * Starts the production build (`node build`) on a fresh SQLite file in its own folder, the way
 * `npm start` does, and waits for /api/health.
 */
export async function startServer(opts: {
	name: string;
	port?: number;
	env?: Record<string, string>;
}): Promise<RunningServer> {
	const port = opts.port ?? (await freePort());
	const dataDir = resolve('tests/.tmp', `${opts.name}-${process.pid}-${Date.now()}`);
	rmSync(dataDir, { recursive: true, force: true });
	mkdirSync(dataDir, { recursive: true });
	const baseUrl = `http://127.0.0.1:${port}`;
	let output = '';
	const child: ChildProcess = spawn(process.execPath, ['build'], {
		env: {
			...process.env,
			NODE_ENV: 'test',
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: baseUrl,
			DATABASE_URL: `file:${join(dataDir, 'causeway.db')}`,
			MAIL_DIR: join(dataDir, 'mail-out'),
			...opts.env
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	child.stdout?.on('data', (d) => (output += d));
	child.stderr?.on('data', (d) => (output += d));
	const deadline = Date.now() + 30_000;
	for (;;) {
		if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
		try {
			const res = await fetch(`${baseUrl}/api/health`);
			if (res.ok) break;
		} catch {
			// not listening yet
		}
		if (Date.now() > deadline) {
			child.kill();
			throw new Error(`server did not become healthy in 30 s:\n${output}`);
		}
		await new Promise((r) => setTimeout(r, 150));
	}
	return {
		baseUrl,
		pid: child.pid as number,
		dataDir,
		output: () => output,
		stop: () =>
			new Promise<void>((resolveStop) => {
				if (child.exitCode !== null) return resolveStop();
				child.on('exit', () => resolveStop());
				child.kill('SIGTERM');
			})
	};
}
