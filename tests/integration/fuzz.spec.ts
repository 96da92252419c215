import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ERROR_CODES } from '../../src/lib/api/error-codes';
import { getOpenApiDocument } from '../../src/lib/server/openapi';
import { Client } from '../support/client';
import { startServer, type RunningServer } from '../support/server';
import {
	formBody,
	hostileString,
	jsonBody,
	type JsonSchema,
	type SchemaContext
} from './fuzz-arbitraries';
import { DEMO, DEMO_API_KEY, DEMO_PASSWORD } from './helpers';
import { actionPath, listEndpoints, listFormActions } from './route-tree';

// Random and hostile bodies against every JSON endpoint and every form action of the production
// server: no answer may be a 500, an API error that is not the contract's JSON, or slower than a
// second. Seeded (FUZZ_SEED to replay a failure) and bounded in count (FUZZ_RUNS per target).
// The server is its own, so what the fuzz changes (a shop renamed, a key made) touches no other test.

const SEED = Number(process.env.FUZZ_SEED ?? 20261202);
/** Requests per target: an endpoint answers in a few ms, a form action (some hash a password) slower. */
const API_RUNS = Number(process.env.FUZZ_RUNS ?? 250);
const FORM_RUNS = Number(process.env.FUZZ_RUNS ?? 70);
const SLOW_MS = 1000;
const ABORT_MS = 5000;

const ROLES = DEMO;
type Caller = keyof typeof ROLES | 'anonymous' | 'apiKey';
const CALLERS: Caller[] = [
	'anonymous',
	'apiKey',
	...(Object.keys(ROLES) as (keyof typeof ROLES)[])
];

let server: RunningServer;
const clients = new Map<Caller, Client>();

async function signIn(caller: keyof typeof ROLES) {
	const client = new Client(server.baseUrl);
	await client.signIn(ROLES[caller], DEMO_PASSWORD);
	clients.set(caller, client);
}

beforeAll(async () => {
	server = await startServer({
		name: 'fuzz',
		env: {
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD,
			DEMO_API_KEY,
			// Limits would answer most of the fuzz 429 and hide the code behind them.
			API_RATE_LIMIT_PER_MINUTE: '1000000',
			API_IP_RATE_LIMIT_PER_MINUTE: '1000000',
			LOGIN_MAX_ATTEMPTS: '1000000',
			SIGNUP_LIMIT_PER_HOUR: '1000000'
		}
	});
	clients.set('anonymous', new Client(server.baseUrl));
	clients.set('apiKey', new Client(server.baseUrl));
	for (const role of Object.keys(ROLES) as (keyof typeof ROLES)[]) await signIn(role);
	await collectFieldNames();
}, 60_000);

afterAll(async () => {
	await server?.stop();
});

// ── What the targets read: fields and values, so the fuzz reaches past "unknown field" ──

type PageForm = { fields: string[]; values: string[] };
const pageForms = new Map<string, PageForm>();
let openapi: {
	paths: Record<
		string,
		Record<string, { requestBody?: { content: Record<string, { schema: JsonSchema }> } }>
	>;
	components: { schemas: Record<string, JsonSchema> };
};
let apiContext: SchemaContext;

/** The request schemas from OpenAPI, the rulebook's observations, and each page's form fields. */
async function collectFieldNames() {
	openapi = await (await fetch(`${server.baseUrl}/api/v1/openapi.json`)).json();
	const { observations } = JSON.parse(readFileSync('rules/observations.json', 'utf8')) as {
		observations: { key: string; values?: string[] }[];
	};
	const seen = new Set<string>(observations.flatMap((o) => o.values ?? []));
	for (const { route } of listFormActions()) {
		const html = await (await clients.get('admin')!.get(concretePath(route, 'x'))).text();
		const fields = [...new Set([...html.matchAll(/\bname="([^"]+)"/g)].map((m) => m[1]))];
		const values = [...new Set([...html.matchAll(/\bvalue="([^"]*)"/g)].map((m) => m[1]))];
		pageForms.set(route, { fields, values });
		for (const value of values) seen.add(value);
	}
	apiContext = { root: {}, recordKeys: observations.map((o) => o.key), seen: [...seen] };
}

/** The request body schema OpenAPI gives for a path and method, with its own document as root. */
function requestSchema(path: string, method: string): JsonSchema | undefined {
	const ref =
		openapi.paths[path]?.[method.toLowerCase()]?.requestBody?.content['application/json']?.schema
			.$ref;
	return ref ? openapi.components.schemas[ref.split('/').at(-1)!] : undefined;
}

/** A JSON body for the path: shaped by its POST schema where OpenAPI has one. */
function bodyFor(path: string) {
	const schema = requestSchema(path, 'POST');
	return jsonBody(schema, { ...apiContext, root: schema ?? {}, document: openapi });
}

/** A path segment from any string (a lone surrogate cannot be percent-encoded: it becomes U+FFFD). */
const segmentOf = (text: string) => encodeURIComponent(text.toWellFormed()) || 'x';

/** A route pattern with each `[param]` filled in. */
const concretePath = (route: string, param: string) => route.replace(/\[[^\]]+\]/g, param);

// ── One request and what must hold of its answer ──

type Sent = { caller: Caller; method: string; path: string; headers: Record<string, string> };

async function send(sent: Sent, body: BodyInit | undefined) {
	const client = clients.get(sent.caller)!;
	const hadSession = client.cookies.size > 0;
	const headers = { ...sent.headers };
	if (sent.caller === 'apiKey') headers.authorization = `Bearer ${DEMO_API_KEY}`;
	const started = performance.now();
	const res = await client.request(sent.path, {
		method: sent.method,
		headers,
		body: sent.method === 'GET' || sent.method === 'HEAD' ? undefined : body,
		signal: AbortSignal.timeout(ABORT_MS)
	});
	const text = await res.text();
	const ms = performance.now() - started;
	// A fuzzed sign-out (or a change to one's own account) ends the session: sign in again.
	if (hadSession && client.cookies.size === 0 && sent.caller in ROLES) {
		await signIn(sent.caller as keyof typeof ROLES);
	}
	return { status: res.status, type: res.headers.get('content-type') ?? '', text, ms };
}

type Answer = Awaited<ReturnType<typeof send>>;

function problemsOf(sent: Sent, answer: Answer): string[] {
	const problems: string[] = [];
	if (answer.status >= 500) problems.push(`status ${answer.status}`);
	if (answer.ms > SLOW_MS) problems.push(`answered in ${Math.round(answer.ms)} ms`);
	const api = sent.path.startsWith('/api/');
	const wantsJson = api || sent.headers.accept === 'application/json';
	if (wantsJson && answer.status >= 400 && sent.method !== 'HEAD') {
		let body: { error?: { code?: unknown; message?: unknown }; type?: unknown } | undefined;
		try {
			body = JSON.parse(answer.text);
		} catch {
			problems.push(`error answer is not JSON (${answer.type}): ${answer.text.slice(0, 80)}`);
		}
		if (body && api) {
			const code = body.error?.code;
			if (!ERROR_CODES.includes(code as never) || typeof body.error?.message !== 'string') {
				problems.push(`not the contract's error shape: ${answer.text.slice(0, 120)}`);
			}
		}
	}
	return problems;
}

async function check(sent: Sent, body: BodyInit | undefined, shown: string) {
	let answer: Answer;
	try {
		answer = await send(sent, body);
	} catch (error) {
		throw new Error(
			`${sent.method} ${sent.path} as ${sent.caller}: no answer (${error})\n${shown}`,
			{ cause: error }
		);
	}
	const problems = problemsOf(sent, answer);
	if (problems.length) {
		const what = `${sent.method} ${sent.path} as ${sent.caller} (${sent.headers['content-type']})`;
		throw new Error(`${what}: ${problems.join('; ')}\nbody: ${shown.slice(0, 400)}`);
	}
}

const fuzzOptions = (numRuns: number) => ({ seed: SEED, numRuns, endOnFailure: true });

// ── The targets ──

const endpoints = listEndpoints();
const actions = listFormActions();

/** Each concrete path OpenAPI lists for an endpoint (each calculator, say), and for an endpoint
 * with a parameter also hostile values of it. */
const apiTargets = endpoints.flatMap(({ route, methods }) => {
	const pattern = new RegExp(`^${route.replace(/\[[^\]]+\]/g, '[^/]+')}$`);
	const listed = Object.keys(getOpenApiDocument().paths as object).filter((p) => pattern.test(p));
	const fixed = route.includes('[') ? listed : [route];
	const targets: { label: string; route: string; path?: string; methods: string[] }[] = fixed.map(
		(path) => ({ label: path, route, path, methods })
	);
	if (route.includes('[')) targets.push({ label: `${route} (hostile)`, route, methods });
	return targets;
});

describe('fuzz: JSON endpoints', () => {
	it('finds the endpoints in the route tree', () => {
		expect(endpoints.map((e) => e.route)).toContain('/api/v1/diagnose');
	});

	it.each(apiTargets)(
		'$label ($methods) answers hostile requests with a 4xx JSON error, fast',
		{ timeout: 120_000 },
		async ({ route, path: fixedPath, methods }) => {
			const path = fixedPath
				? fc.constant(fixedPath)
				: fc.oneof(
						hostileString.map((s) => concretePath(route, segmentOf(s))),
						fc.constant(concretePath(route, '%E0%A4%A'))
					);
			const request = fc
				.record({
					// Mostly a caller who may, with a body: the code behind the checks is what is fuzzed.
					caller: fc.oneof(
						{ weight: 3, arbitrary: fc.constant<Caller>('apiKey') },
						{ weight: 3, arbitrary: fc.constantFrom<Caller>(...CALLERS) }
					),
					method: fc.oneof(
						{ weight: 6, arbitrary: fc.constant(methods.includes('POST') ? 'POST' : methods[0]) },
						{ weight: 1, arbitrary: fc.constantFrom(...methods) },
						{
							weight: 1,
							arbitrary: fc.constantFrom('GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'HEAD')
						}
					),
					path,
					body: fc.constant(''),
					type: fc.oneof(
						{ weight: 6, arbitrary: fc.constant('application/json') },
						{
							weight: 1,
							arbitrary: fc.constantFrom(
								'text/plain',
								'application/x-www-form-urlencoded',
								'application/json; charset=utf-16',
								'application/xml'
							)
						}
					)
				})
				.chain((r) => bodyFor(r.path).map((body) => ({ ...r, body })));
			let sent = 0;
			await fc.assert(
				fc.asyncProperty(request, async ({ caller, method, path, type, body }) => {
					sent++;
					await check({ caller, method, path, headers: { 'content-type': type } }, body, body);
				}),
				fuzzOptions(API_RUNS)
			);
			expect(sent).toBe(API_RUNS); // fc.assert has thrown on any request that broke a rule
		}
	);
});

describe('fuzz: form actions', () => {
	it('finds the form actions in the route tree', () => {
		expect(actions.map((a) => `${a.route} ${a.action}`)).toContain('/signin default');
	});

	it.each(actions)(
		'$route ?/$action answers hostile posts without a 500, fast',
		{
			timeout: 120_000
		},
		async ({ route, action }) => {
			const own = pageForms.get(route);
			const everyField = [...new Set([...pageForms.values()].flatMap((form) => form.fields))];
			const fields = own?.fields.length ? own.fields : everyField;
			const segment = fc.oneof(
				fc.constant('x'),
				hostileString.map((s) => segmentOf(s))
			);
			const request = fc.record({
				caller: fc.constantFrom<Caller>(...CALLERS),
				page: route.includes('[') ? segment.map((s) => concretePath(route, s)) : fc.constant(route),
				enhanced: fc.boolean(),
				form: formBody(fields, [...(own?.values ?? []), ...apiContext.seen])
			});
			let sent = 0;
			await fc.assert(
				fc.asyncProperty(request, async ({ caller, page, enhanced, form }) => {
					sent++;
					const headers: Record<string, string> = { origin: server.baseUrl };
					if (form.type) headers['content-type'] = form.type;
					if (enhanced) {
						headers.accept = 'application/json';
						headers['x-sveltekit-action'] = 'true';
					}
					const path = actionPath(page, action);
					await check({ caller, method: 'POST', path, headers }, form.body, form.shown);
				}),
				fuzzOptions(FORM_RUNS)
			);
			expect(sent).toBe(FORM_RUNS); // fc.assert has thrown on any request that broke a rule
		}
	);
});
