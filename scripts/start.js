// npm start: build when there is no build (or the sources are newer), then serve the production
// build. The server applies migrations at start and, with CAUSEWAY_SEED_DEMO=1 (the default
// here), seeds the demo shop into an empty database.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const BUILD_ENTRY = 'build/index.js';
const SOURCES = [
	'src',
	'static',
	'package.json',
	'svelte.config.js',
	'vite.config.ts',
	'tailwind.config.ts'
];

function newestMtime(path) {
	if (!existsSync(path)) return 0;
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	let newest = stat.mtimeMs;
	for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
	return newest;
}

const stale =
	!existsSync(BUILD_ENTRY) || Math.max(...SOURCES.map(newestMtime)) > statSync(BUILD_ENTRY).mtimeMs;
if (stale) {
	console.log('Causeway: building the app (first start or changed sources)…');
	const result = spawnSync('npx', ['vite', 'build'], { stdio: 'inherit' });
	if (result.status !== 0) process.exit(result.status ?? 1);
}

const port = process.env.PORT ?? '3000';
const env = {
	...process.env,
	PORT: port,
	// adapter-node refuses form posts unless it knows the site's origin.
	ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}`,
	CAUSEWAY_SEED_DEMO: process.env.CAUSEWAY_SEED_DEMO ?? '1'
};
const server = spawn(process.execPath, ['build'], { stdio: 'inherit', env });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));
// The server itself says "Listening on …", or one line on why it cannot start (exit code kept).
console.log(`Causeway: starting for ${env.ORIGIN}…`);
