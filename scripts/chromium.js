// Finds the Chromium the end-to-end tests drive, and installs Debian's when none is there and
// this machine can (root with apt-get). Never downloads a browser build of its own.
import { spawnSync } from 'node:child_process';
import { accessSync, constants } from 'node:fs';

const DEBIAN_PATH = '/usr/bin/chromium';

const executable = (path) => {
	try {
		accessSync(path, constants.X_OK);
		return true;
	} catch {
		return false;
	}
};

const onPath = (name) => spawnSync('sh', ['-c', `command -v ${name}`], { encoding: 'utf8' });

/** @returns {{ path: string } | { error: string }} */
export function ensureChromium(env = process.env) {
	if (env.CHROMIUM_PATH) {
		return executable(env.CHROMIUM_PATH)
			? { path: env.CHROMIUM_PATH }
			: { error: `CHROMIUM_PATH=${env.CHROMIUM_PATH} is not an executable file.` };
	}
	if (executable(DEBIAN_PATH)) return { path: DEBIAN_PATH };
	const canInstall = process.getuid?.() === 0 && onPath('apt-get').status === 0;
	if (!canInstall) {
		return {
			error:
				'End-to-end tests need Chromium: install it (Debian: sudo apt-get install -y chromium) or set CHROMIUM_PATH to a Chromium binary.'
		};
	}
	console.log(
		'No Chromium found: installing Debian’s (apt-get install -y chromium, about a minute)…'
	);
	const env2 = { ...env, DEBIAN_FRONTEND: 'noninteractive' };
	const quiet = { stdio: ['ignore', 'ignore', 'inherit'], env: env2 };
	const installed =
		spawnSync('apt-get', ['update', '-qq'], quiet).status === 0 &&
		spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], quiet).status === 0;
	if (installed && executable(DEBIAN_PATH)) return { path: DEBIAN_PATH };
	return {
		error:
			'Installing Chromium with apt-get failed (see above): install it by hand (apt-get install -y chromium) or set CHROMIUM_PATH.'
	};
}
