// npm run bench: what a case costs json-rules-engine and the diagnosis, and what the API sustains.
// 1. Per case, in this process: the engine's own run, replay, complaint matching, and a diagnose
//    request's work (parse, validate, analyse, shape, write JSON) on the same answers as the API
//    bodies below, on the base rulebook and on a synthetic one ten times larger.
// 2. The API: POST /api/v1/diagnose against GET /api/health on one production server (autocannon,
//    10 connections), with a fixed and with varied bodies, and the server's CPU time per request.
//    The endpoints take turns for several rounds and the medians are reported: on a shared 2-core
//    machine the speed drifts from one minute to the next, and taking turns cancels the drift out
//    of the ratio. The run fails (exit 1) when the contract's floor is not met.
import { existsSync, readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import autocannon from 'autocannon';
import { shapeDiagnosis } from '../src/lib/api/diagnosis-response';
import { createResponseSerializer } from '../src/lib/api/response-json';
import { diagnoseRequestSchema } from '../src/lib/api/schema';
import { createDiagnoser, replay, type Diagnoser, type Rulebook } from '../src/lib/diagnosis';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { startServer } from '../tests/support/server';
import { makeSyntheticRulebook } from '../tests/support/synthetic-rulebook';

type Value = boolean | string | number;
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 4);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const CONNECTIONS = 10;
/** The contract's floor: diagnose throughput at least this share of health's, p99 under this. */
const MIN_SHARE_OF_HEALTH = 0.05;
const MAX_P99_MS = 150;

/** A deterministic pseudo-random generator, so every run measures the same cases. */
function mulberry32(seed: number) {
	return () => {
		seed |= 0;
		seed = (seed + 0x6d2b79f5) | 0;
		let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Cases like a technician's part-way through: a handful to a dozen answered observations. */
function makeCases(rulebook: Rulebook, count: number, seed = 7) {
	const random = mulberry32(seed);
	return Array.from({ length: count }, () => {
		const observations: Record<string, Value> = {};
		const answered = 3 + Math.floor(random() * 10);
		for (let i = 0; i < answered; i++) {
			const o = rulebook.observations[Math.floor(random() * rulebook.observations.length)];
			if (o.kind === 'boolean') observations[o.key] = random() < 0.5;
			else if (o.kind === 'enum')
				observations[o.key] = o.values[Math.floor(random() * o.values.length)];
			else observations[o.key] = o.bins[Math.floor(random() * o.bins.length)].value;
		}
		return observations;
	});
}

const COMPLAINTS = [
	'gets hot sitting in traffic, fine on the motorway',
	'sweet smell inside the car and the windows fog up',
	'losing water but no leaks on the drive',
	'white smoke out the back all the time and the heater blows cold',
	'temp gauge goes up and down, steam from under the bonnet after a long drive'
];

/** The bodies the API part sends: one fixed, and 200 varied (every other one with a complaint). */
function makeApiBodies(base: Rulebook) {
	const fixed = {
		observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false, coolant_level: 'full' },
		complaint: COMPLAINTS[0]
	};
	const varied = makeCases(base, 200, 11).map((observations, i) => ({
		observations,
		complaint: i % 2 ? `${COMPLAINTS[i % COMPLAINTS.length]} (visit ${i})` : undefined
	}));
	return { fixed, varied };
}

/** µs per item: a warm-up pass, then the median of three timed passes. */
async function timePerItem<T>(items: readonly T[], fn: (item: T) => unknown): Promise<number> {
	for (const item of items.slice(0, 50)) await fn(item);
	const passes: number[] = [];
	for (let pass = 0; pass < 3; pass++) {
		const started = performance.now();
		for (const item of items) await fn(item);
		passes.push(((performance.now() - started) * 1000) / items.length);
	}
	return median(passes);
}

const median = (values: number[]) =>
	[...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

/** What POST /api/v1/diagnose does with a body once the caller is known, without the HTTP. */
function makeRequestWork(diagnoser: Diagnoser) {
	const serializer = createResponseSerializer();
	return async (body: unknown) => {
		const request = diagnoseRequestSchema.parse(body);
		if (diagnoser.validateObservations(request.observations, request.unknown).length) {
			throw new Error('bench body does not fit the rulebook');
		}
		const analysis = await diagnoser.analyse(request, { questionLimit: 10 });
		const response = {
			rulebook: { edition: 1, publishedAt: null },
			...shapeDiagnosis(analysis, { testSteps: false }),
			caseId: null
		};
		return serializer.stringify(response);
	};
}

async function benchEngine() {
	const base = loadRulebookFromDir('rules');
	const rows: Record<string, string | number>[] = [];
	for (const [name, rulebook] of [
		['base', base],
		['synthetic ×10', makeSyntheticRulebook(base, 10)]
	] as const) {
		const diagnoser = createDiagnoser(rulebook);
		const cases = makeCases(rulebook, name === 'base' ? 1000 : 200);
		const row = (step: string, us: number) =>
			rows.push({
				rulebook: name,
				rules: rulebook.rules.length,
				step,
				'µs per case': Math.round(us)
			});
		row(
			'json-rules-engine run (rules waiting for an unanswered observation left out)',
			await timePerItem(cases, (facts) =>
				diagnoser.evaluateWithEngine(facts, { skipWaitingRules: true })
			)
		);
		row(
			'json-rules-engine run, every rule',
			await timePerItem(cases.slice(0, name === 'base' ? 200 : 60), (facts) =>
				diagnoser.evaluateWithEngine(facts)
			)
		);
		const started = performance.now();
		const replayed = await replay(
			diagnoser,
			cases.map((observations) => ({ observations }))
		);
		row(
			`replay (${replayed.length} stored answer sets, ranked)`,
			((performance.now() - started) * 1000) / replayed.length
		);
		row(
			'analyse (rank + next questions + tests)',
			await timePerItem(cases, (observations) => diagnoser.analyse({ observations }))
		);
	}
	console.log('\nEngine cost per case (deterministic random cases; median of three passes)');
	console.table(rows);
	return base;
}

/** The engine's own run against a diagnose request's work, on the API bodies' answers. */
async function benchRequestWork(base: Rulebook) {
	const diagnoser = createDiagnoser(base);
	const work = makeRequestWork(diagnoser);
	const { fixed, varied } = makeApiBodies(base);
	const rows: Record<string, string | number>[] = [];
	for (const [name, bodies] of [
		['same body', [fixed]],
		['200 varied bodies', varied]
	] as const) {
		// The answers the engine sees: explicit, and what the complaint gives.
		const answers = bodies.map((body) => ({
			...Object.fromEntries(
				diagnoser.matchComplaint(body.complaint ?? '').map((match) => [match.key, match.value])
			),
			...body.observations
		}));
		const repeat = <T,>(items: readonly T[]) =>
			Array.from({ length: 1000 }, (_, index) => items[index % items.length]);
		const engineUs = await timePerItem(repeat(answers), (facts) =>
			diagnoser.evaluateWithEngine(facts, { skipWaitingRules: true })
		);
		const requestUs = await timePerItem(repeat(bodies), work);
		const complaints = bodies.flatMap((body) => (body.complaint ? [body.complaint] : []));
		const complaintUs = await timePerItem(repeat(complaints), (text) =>
			diagnoser.matchComplaint(text)
		);
		rows.push({
			bodies: name,
			'engine run µs': Math.round(engineUs),
			'request work µs': Math.round(requestUs),
			'request / engine': Number((requestUs / engineUs).toFixed(2)),
			'complaint matching µs (per complaint)': Math.round(complaintUs)
		});
	}
	console.log(
		'\nA diagnose request’s work (parse, validate, complaint, engine, look-ahead, tests, shape, JSON) against the engine’s own run on the same answers, base rulebook'
	);
	console.table(rows);
}

type LoadResult = {
	'req/s': number;
	'p50 ms': number;
	'p99 ms': number;
	'server CPU ms per request': number;
	errors: number;
	'non-2xx': number;
	requests: number;
};

/** CPU seconds (user + system) the process has used, from /proc (Linux). */
function readCpuSeconds(pid: number): number {
	const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
	return (Number(fields[11]) + Number(fields[12])) / 100;
}

async function load(
	pid: number,
	url: string,
	opts: Partial<autocannon.Options>
): Promise<LoadResult> {
	const cpuBefore = readCpuSeconds(pid);
	const result = await autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, ...opts });
	const cpuSeconds = readCpuSeconds(pid) - cpuBefore;
	return {
		'req/s': Math.round(result.requests.average),
		'p50 ms': result.latency.p50,
		'p99 ms': result.latency.p99,
		'server CPU ms per request': Number(((cpuSeconds * 1000) / result.requests.total).toFixed(2)),
		errors: result.errors + result.timeouts,
		'non-2xx': result.non2xx,
		requests: result.requests.total
	};
}

/** Medians over the rounds; errors and non-2xx summed. */
function summarise(runs: LoadResult[]): LoadResult {
	const pick = (key: keyof LoadResult) => median(runs.map((run) => run[key]));
	return {
		'req/s': pick('req/s'),
		'p50 ms': pick('p50 ms'),
		'p99 ms': pick('p99 ms'),
		'server CPU ms per request': pick('server CPU ms per request'),
		errors: runs.reduce((sum, run) => sum + run.errors, 0),
		'non-2xx': runs.reduce((sum, run) => sum + run['non-2xx'], 0),
		requests: runs.reduce((sum, run) => sum + run.requests, 0)
	};
}

async function benchApi(base: Rulebook): Promise<boolean> {
	if (!existsSync('build/index.js')) {
		const built = spawnSync('npx', ['vite', 'build'], { stdio: 'inherit' });
		if (built.status !== 0) throw new Error('build failed');
	}
	const key = 'cw_benchmarkintakekey00000000001';
	const server = await startServer({
		name: 'bench',
		env: {
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD: 'bench-demo-password',
			DEMO_API_KEY: key,
			API_RATE_LIMIT_PER_MINUTE: '100000000',
			API_IP_RATE_LIMIT_PER_MINUTE: '100000000'
		}
	});
	try {
		const headers = { authorization: `Bearer ${key}`, 'content-type': 'application/json' };
		const { fixed, varied } = makeApiBodies(base);
		const fixedBody = JSON.stringify(fixed);
		const bodies = varied.map((body) => JSON.stringify(body));
		let next = 0;
		const diagnoseUrl = `${server.baseUrl}/api/v1/diagnose`;
		// Warm the server (JIT, compiled edition) before measuring.
		await load(server.pid, diagnoseUrl, { method: 'POST', headers, body: fixedBody, duration: 2 });
		const endpoints: Record<string, () => Promise<LoadResult>> = {
			'GET /api/health': () => load(server.pid, `${server.baseUrl}/api/health`, {}),
			'POST /api/v1/diagnose (same body)': () =>
				load(server.pid, diagnoseUrl, { method: 'POST', headers, body: fixedBody }),
			'POST /api/v1/diagnose (200 varied bodies)': () =>
				load(server.pid, diagnoseUrl, {
					requests: [
						{
							method: 'POST',
							headers,
							setupRequest: (request) => ({ ...request, body: bodies[next++ % bodies.length] })
						}
					]
				})
		};
		const runs: Record<string, LoadResult[]> = {};
		const ratios: Record<string, number[]> = {};
		for (let round = 0; round < ROUNDS; round++) {
			let health = 0;
			for (const [name, run] of Object.entries(endpoints)) {
				const result = await run();
				(runs[name] ??= []).push(result);
				if (name.startsWith('GET')) health = result['req/s'];
				else (ratios[name] ??= []).push(result['req/s'] / health);
			}
		}
		const rows = Object.fromEntries(
			Object.entries(runs).map(([name, results]) => [name, summarise(results)])
		);
		console.log(
			`\nAPI throughput, json-rules-engine deciding the rules, ${CONNECTIONS} connections, ${ROUNDS} rounds of ${DURATION_S} s per endpoint taken in turn (medians), server and load on this machine`
		);
		console.table(rows);
		let ok = true;
		for (const [name, values] of Object.entries(ratios)) {
			const share = median(values);
			const { 'p99 ms': p99, errors, 'non-2xx': non2xx } = rows[name];
			const holds = share >= MIN_SHARE_OF_HEALTH && p99 < MAX_P99_MS && errors + non2xx === 0;
			ok &&= holds;
			console.log(
				`${name}: ${share.toFixed(2)} of health throughput (rounds ${values.map((value) => value.toFixed(2)).join(', ')}), p99 ${p99} ms, ${errors} errors, ${non2xx} non-2xx: ${holds ? 'meets' : 'FAILS'} the floor (≥ ${MIN_SHARE_OF_HEALTH}, p99 < ${MAX_P99_MS} ms, no errors)`
			);
		}
		return ok;
	} finally {
		await server.stop();
	}
}

// --- Case timeline: appending an answer at the bay -------------------------------------------

/** Valid answers to append, taken in turn so the ranking moves with each one. */
const CASE_ANSWERS: [string, Value][] = [
	['temp_gauge', 'high_at_idle'],
	['fan_runs_when_hot', false],
	['coolant_level', 'low'],
	['temp_gauge', 'normal'],
	['sweet_smell', 'cabin'],
	['fan_runs_when_hot', true],
	['coolant_level', 'full'],
	['exhaust_smoke', 'white_persistent']
];

/**
 * 10 technicians at once, each on a case of their own (one autocannon connection per case and
 * session), appending an answer and receiving the new ranking, in turns with GET /api/health.
 * Every session belongs to the demo technician: the work per request is the same as for ten people.
 */
async function benchCaseAppends() {
	const { Client } = await import('../tests/support/client');
	if (!existsSync('build/index.js')) throw new Error('no build: run npx vite build first');
	const server = await startServer({
		name: 'bench-cases',
		env: {
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD: 'bench-demo-password',
			API_RATE_LIMIT_PER_MINUTE: '100000000',
			API_IP_RATE_LIMIT_PER_MINUTE: '100000000'
		}
	});
	try {
		const technicians = [];
		for (let i = 0; i < 10; i++) {
			const client = new Client(server.baseUrl);
			await client.signIn('tech@saltmarsh.example', 'bench-demo-password');
			const opened = await client.json('/api/v1/cases', { vehicle: { plate: `BENCH${i}` } });
			if (opened.status !== 201) throw new Error(`opening a case failed: ${opened.status}`);
			const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
			technicians.push({ path: `/api/v1/cases/${opened.body.case.id}/events`, cookie });
		}
		let connections = 0;
		let sent = 0;
		const append = () =>
			load(server.pid, server.baseUrl, {
				requests: [
					{
						method: 'POST',
						setupRequest: (request, context: { technician?: number }) => {
							context.technician ??= connections++ % technicians.length;
							const { path, cookie } = technicians[context.technician];
							const [key, value] = CASE_ANSWERS[sent++ % CASE_ANSWERS.length];
							return {
								...request,
								path,
								headers: { cookie, 'content-type': 'application/json' },
								body: JSON.stringify({
									id: crypto.randomUUID(),
									kind: 'answer_set',
									payload: { key, value }
								})
							};
						}
					}
				]
			});
		// What a second device polls to follow a case: the session, the case row, no new events.
		const poll = () =>
			load(server.pid, server.baseUrl, {
				requests: [
					{
						method: 'GET',
						setupRequest: (request, context: { technician?: number }) => {
							context.technician ??= connections++ % technicians.length;
							const { path, cookie } = technicians[context.technician];
							return { ...request, path: `${path}?after=1000000`, headers: { cookie } };
						}
					}
				]
			});
		await append(); // warm-up: JIT, compiled edition, prepared statements
		const runs: Record<string, LoadResult[]> = {};
		for (let round = 0; round < ROUNDS; round++) {
			(runs['GET /api/health'] ??= []).push(
				await load(server.pid, `${server.baseUrl}/api/health`, {})
			);
			(runs['GET /api/v1/cases/{id}/events?after= (poll, nothing new)'] ??= []).push(await poll());
			(runs['POST /api/v1/cases/{id}/events'] ??= []).push(await append());
		}
		console.log(
			`\nCase timeline: 10 technicians on 10 cases appending an answer (session cookies), ${ROUNDS} rounds of ${DURATION_S} s taken in turn with health (medians)`
		);
		console.table(
			Object.fromEntries(Object.entries(runs).map(([name, results]) => [name, summarise(results)]))
		);
		const events = runs['POST /api/v1/cases/{id}/events'].reduce((n, r) => n + r.requests, 0);
		console.log(
			`Each case held about ${Math.round(events / technicians.length)} events by the end (an append reads the answers kept on the case row, not the timeline).`
		);
	} finally {
		await server.stop();
	}
}

if (process.argv.includes('--cases-only')) {
	await benchCaseAppends();
} else {
	const base = await benchEngine();
	await benchRequestWork(base);
	if (!process.argv.includes('--engine-only')) {
		if (!(await benchApi(base))) process.exitCode = 1;
		await benchCaseAppends();
	}
}
