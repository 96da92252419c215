// npm run bench: what a case costs the engine, and what the API sustains on this machine.
// 1. Engine per case on the base rulebook and on a synthetic rulebook ten times larger.
// 2. API throughput: POST /api/v1/diagnose against GET /api/health on the same production server
//    (autocannon, 10 connections), with fixed and with varied request bodies. The endpoints take
//    turns for several rounds and the medians are reported: on a shared 2-core machine the speed
//    drifts by a quarter from one minute to the next, and taking turns cancels the drift out of
//    the ratio.
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import autocannon from 'autocannon';
import { createDiagnoser, makeSyntheticRulebook, type Rulebook } from '../src/lib/diagnosis';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { compileRulebook, evaluateCompiled, toFactVector } from '../src/lib/diagnosis/evaluate';
import { planNextQuestions } from '../src/lib/diagnosis/next-question';
import { sumLogOdds } from '../src/lib/diagnosis/rank';
import { startServer } from '../tests/support/server';

type Value = boolean | string | number;
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 4);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);

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

async function timePerCase(label: string, cases: unknown[], fn: (c: never) => unknown) {
	for (const c of cases.slice(0, 50)) await fn(c as never); // warm-up
	const started = performance.now();
	for (const c of cases) await fn(c as never);
	const us = ((performance.now() - started) * 1000) / cases.length;
	return { label, us };
}

const COMPLAINTS = [
	'gets hot sitting in traffic, fine on the motorway',
	'sweet smell inside the car and the windows fog up',
	'losing water but no leaks on the drive',
	'white smoke out the back all the time and the heater blows cold',
	'temp gauge goes up and down, steam from under the bonnet after a long drive'
];

async function benchEngine() {
	const base = loadRulebookFromDir('rules');
	const rows: { rulebook: string; rules: number; label: string; us: number }[] = [];
	for (const [name, rulebook] of [
		['base', base],
		['synthetic ×10', makeSyntheticRulebook(base, 10)]
	] as const) {
		const diagnoser = createDiagnoser(rulebook);
		const cases = makeCases(rulebook, name === 'base' ? 1000 : 300);
		const measure = async (label: string, fn: (c: Record<string, Value>) => unknown) =>
			rows.push({
				rulebook: name,
				rules: rulebook.rules.length,
				...(await timePerCase(label, cases, fn))
			});
		await measure('json-rules-engine run', (facts) => diagnoser.evaluateWithEngine(facts));
		await measure('compiled predicates', (facts) => diagnoser.evaluateCompiled(facts));
		await measure('diagnose, engine evaluation (rank + next questions + tests)', (observations) =>
			diagnoser.diagnose({ observations }, { evaluator: 'engine' })
		);
		const compiled = compileRulebook(diagnoser.rulebook);
		await measure('next questions alone (look-ahead over every unanswered one)', (observations) => {
			const facts = toFactVector(compiled, Object.entries(observations));
			const fired = evaluateCompiled(compiled, facts);
			return planNextQuestions(
				compiled,
				{ facts, fired, logOdds: sumLogOdds(compiled, fired) },
				new Set()
			);
		});
		await measure('diagnose, compiled evaluation', (observations) =>
			diagnoser.diagnose({ observations }, { evaluator: 'compiled' })
		);
		await measure('diagnose as the API answers (best 10 questions, no steps)', (observations) =>
			diagnoser.diagnose(
				{ observations },
				{ evaluator: 'compiled', questionLimit: 10, testSteps: false }
			)
		);
		if (name === 'base') {
			await measure('the same with a complaint to match', (observations) =>
				diagnoser.diagnose(
					{
						observations,
						complaint: COMPLAINTS[Object.keys(observations).length % COMPLAINTS.length]
					},
					{ evaluator: 'compiled', questionLimit: 10, testSteps: false }
				)
			);
		}
	}
	console.log('\nEngine cost per case (mean over deterministic random cases)');
	console.table(
		rows.map((r) => ({
			rulebook: r.rulebook,
			rules: r.rules,
			step: r.label,
			'µs per case': Math.round(r.us)
		}))
	);
	return rows;
}

type LoadResult = {
	'req/s': number;
	'p50 ms': number;
	'p99 ms': number;
	errors: number;
	'non-2xx': number;
	requests: number;
};

async function load(url: string, opts: Partial<autocannon.Options>): Promise<LoadResult> {
	const result = await autocannon({ url, connections: 10, duration: DURATION_S, ...opts });
	return {
		'req/s': Math.round(result.requests.average),
		'p50 ms': result.latency.p50,
		'p99 ms': result.latency.p99,
		errors: result.errors + result.timeouts,
		'non-2xx': result.non2xx,
		requests: result.requests.total
	};
}

const median = (values: number[]) =>
	[...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

/** Medians over the rounds; errors and non-2xx summed. */
function summarise(runs: LoadResult[]): LoadResult {
	return {
		'req/s': median(runs.map((run) => run['req/s'])),
		'p50 ms': median(runs.map((run) => run['p50 ms'])),
		'p99 ms': median(runs.map((run) => run['p99 ms'])),
		errors: runs.reduce((sum, run) => sum + run.errors, 0),
		'non-2xx': runs.reduce((sum, run) => sum + run['non-2xx'], 0),
		requests: runs.reduce((sum, run) => sum + run.requests, 0)
	};
}

async function benchApi(evaluator: 'compiled' | 'engine') {
	if (!existsSync('build/index.js')) {
		const built = spawnSync('npx', ['vite', 'build'], { stdio: 'inherit' });
		if (built.status !== 0) throw new Error('build failed');
	}
	const key = 'cw_benchmarkintakekey00000000001';
	const server = await startServer({
		name: `bench-${evaluator}`,
		env: {
			DIAGNOSIS_EVALUATOR: evaluator,
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD: 'bench-demo-password',
			DEMO_API_KEY: key,
			API_RATE_LIMIT_PER_MINUTE: '100000000',
			API_IP_RATE_LIMIT_PER_MINUTE: '100000000'
		}
	});
	try {
		const headers = { authorization: `Bearer ${key}`, 'content-type': 'application/json' };
		const fixedBody = JSON.stringify({
			observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false, coolant_level: 'full' },
			complaint: COMPLAINTS[0]
		});
		const base = loadRulebookFromDir('rules');
		const bodies = makeCases(base, 200, 11).map((observations, i) =>
			JSON.stringify({
				observations,
				complaint: i % 2 ? COMPLAINTS[i % COMPLAINTS.length] + ` (visit ${i})` : undefined
			})
		);
		let next = 0;
		// Warm the server (JIT, compiled edition) before measuring.
		await load(`${server.baseUrl}/api/v1/diagnose`, {
			method: 'POST',
			headers,
			body: fixedBody,
			duration: 2
		});
		const endpoints: Record<string, () => Promise<LoadResult>> = {
			'GET /api/health': () => load(`${server.baseUrl}/api/health`, {}),
			'POST /api/v1/diagnose (same body)': () =>
				load(`${server.baseUrl}/api/v1/diagnose`, { method: 'POST', headers, body: fixedBody }),
			'POST /api/v1/diagnose (200 varied bodies)': () =>
				load(`${server.baseUrl}/api/v1/diagnose`, {
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
			`\nAPI throughput, ${evaluator} evaluator, 10 connections, ${ROUNDS} rounds of ${DURATION_S} s per endpoint taken in turn (medians), server and load on this machine`
		);
		console.table(rows);
		for (const [name, values] of Object.entries(ratios)) {
			console.log(
				`${name}: ${(median(values) * 100).toFixed(0)} % of health throughput (median of the rounds; each round ${values.map((value) => (value * 100).toFixed(0)).join(', ')} %)`
			);
		}
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
			load(server.baseUrl, {
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
			load(server.baseUrl, {
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
			(runs['GET /api/health'] ??= []).push(await load(`${server.baseUrl}/api/health`, {}));
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
	await benchEngine();
	if (!process.argv.includes('--engine-only')) {
		await benchApi('compiled');
		await benchApi('engine');
		await benchCaseAppends();
	}
}
