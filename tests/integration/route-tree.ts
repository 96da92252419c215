// The app's JSON endpoints and form actions, read from src/routes, so a new one is covered by the
// tests that walk them (the fuzz test) without being listed by hand.
import { readdirSync, readFileSync } from 'node:fs';
import { join, sep } from 'node:path';

const ROUTES_DIR = join(process.cwd(), 'src', 'routes');
const METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'] as const;

export type Endpoint = { route: string; methods: string[] };
export type FormAction = { route: string; action: string; file: string };

/** `(app)/settings/[id]` → `/settings/[id]`: groups leave the path, parameters stay as patterns. */
function routeOf(file: string): string {
	const segments = file.split(sep).slice(0, -1);
	const path = segments.filter((segment) => !/^\(.+\)$/.test(segment)).join('/');
	return `/${path}`;
}

function routeFiles(name: string): string[] {
	return readdirSync(ROUTES_DIR, { recursive: true, encoding: 'utf8' })
		.filter((file) => file.split(sep).at(-1) === name)
		.sort();
}

/** Every `+server.ts` with the methods it exports. */
export function listEndpoints(): Endpoint[] {
	return routeFiles('+server.ts').map((file) => {
		const source = readFileSync(join(ROUTES_DIR, file), 'utf8');
		const methods = METHODS.filter((method) =>
			new RegExp(`export\\s+(?:const|(?:async\\s+)?function)\\s+${method}\\b`).test(source)
		);
		return { route: routeOf(file), methods };
	});
}

/** Every action of every `+page.server.ts` (`export const actions = { name: …, … }`). */
export function listFormActions(): FormAction[] {
	return routeFiles('+page.server.ts').flatMap((file) => {
		const source = readFileSync(join(ROUTES_DIR, file), 'utf8');
		const block = /export\s+const\s+actions\s*=\s*\{([^}]*)\}/.exec(source)?.[1];
		if (!block) return [];
		return block
			.split(',')
			.map((entry) => entry.split(':')[0].trim())
			.filter((name) => /^\w+$/.test(name))
			.map((action) => ({ route: routeOf(file), action, file }));
	});
}

/** The path to post an action to: the default action at the page, a named one at `?/name`. */
export const actionPath = (path: string, action: string) =>
	action === 'default' ? path : `${path}?/${action}`;
