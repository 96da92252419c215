import { Engine } from 'json-rules-engine';
import { describe, expect, it } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import {
	buildEngineEvaluator,
	canRuleFire,
	MAX_ENGINE_SETS
} from '../../../src/lib/diagnosis/engine';
import { compileRulebook, toFactVector } from '../../../src/lib/diagnosis/evaluate';
import type { ObservationValue, TopLevelCondition } from '../../../src/lib/diagnosis/schema';
import {
	diagnose,
	createRng,
	makeCoolingRulebook,
	makeRandomFacts,
	makeRandomRulebook,
	makeRule,
	makeRulebook,
	makePredicateEvaluator
} from './factories';

describe('compiled predicates', () => {
	it('fire exactly the rules json-rules-engine fires on 2,500 random fact sets', async () => {
		let compared = 0;
		let firedTotal = 0;
		let possibleTotal = 0;
		for (const seed of [11, 12, 13, 14, 15]) {
			// Smaller rulebooks keep 2,500 engine runs short on a small machine; every operator and
			// nesting shape still occurs in each.
			const diagnoser = createDiagnoser(
				makeRandomRulebook(seed, { causes: 8, observations: 20, rules: 40, tests: 4 })
			);
			const evaluateCompiled = makePredicateEvaluator(diagnoser.rulebook);
			const rng = createRng(seed * 7919);
			for (let run = 0; run < 500; run++) {
				// From nearly empty to nearly complete answers, with nulls among the unanswered.
				const facts = makeRandomFacts(diagnoser.rulebook, rng, [0.1, 0.4, 0.7, 0.95][run % 4]);
				const byEngine = await diagnoser.evaluateWithEngine(facts);
				expect(evaluateCompiled(facts), JSON.stringify(facts)).toEqual(byEngine);
				compared++;
				firedTotal += byEngine.length;
				possibleTotal += diagnoser.rulebook.rules.length;
			}
		}
		expect(compared).toBeGreaterThanOrEqual(2000);
		// The comparison means something only if rules both fire and stay quiet often.
		expect(firedTotal / possibleTotal).toBeGreaterThan(0.1);
		expect(firedTotal / possibleTotal).toBeLessThan(0.9);
	}, 60_000);
});

describe('the engine run that skips rules waiting for an unanswered observation', () => {
	it('fires exactly what the full engine run fires, on 600 random fact sets', async () => {
		let skippedSome = 0;
		for (const seed of [16, 17, 18]) {
			const compiled = compileRulebook(makeRandomRulebook(seed));
			const engine = buildEngineEvaluator(compiled);
			const rng = createRng(seed);
			for (let run = 0; run < 200; run++) {
				const facts = toFactVector(
					compiled,
					Object.entries(makeRandomFacts(compiled.rulebook, rng, [0.1, 0.4, 0.8][run % 3]))
				);
				const full = await engine.run(facts);
				expect(await engine.run(facts, { skipWaitingRules: true })).toEqual(full);
				if (compiled.rules.some((rule) => !canRuleFire(rule, facts))) skippedSome++;
			}
		}
		// Most runs really leave rules out, so the equality is tested where it matters.
		expect(skippedSome).toBeGreaterThan(400);
	}, 60_000);
});

describe('an unanswered observation', () => {
	const negativeRules: [string, TopLevelCondition][] = [
		['not-equal', { all: [{ fact: 'temp_gauge', operator: 'notEqual', value: 'normal' }] }],
		[
			'not-in',
			{ any: [{ fact: 'temp_gauge', operator: 'notIn', value: ['normal', 'high_at_idle'] }] }
		],
		[
			'nested-negatives',
			{
				any: [
					{ all: [{ fact: 'fan_runs_when_hot', operator: 'notEqual', value: true }] },
					{
						all: [
							{ any: [{ fact: 'temp_gauge', operator: 'notIn', value: ['normal'] }] },
							{ fact: 'loss_l_per_week', operator: 'notEqual', value: 0 }
						]
					}
				]
			}
		],
		['boolean-not-in', { all: [{ fact: 'fan_runs_when_hot', operator: 'notIn', value: [true] }] }],
		['number-below', { all: [{ fact: 'loss_l_per_week', operator: 'lessThan', value: 5 }] }]
	];

	function makeNegativeRulebook() {
		return makeRulebook({
			rules: [
				...makeRulebook().rules,
				...negativeRules.map(([key, conditions]) =>
					makeRule({ key: `only-${key}`, cause: 'thermostat_stuck_closed', lr: 2, conditions })
				)
			]
		});
	}

	it('never satisfies notEqual or notIn, alone or nested in any/all', async () => {
		const diagnoser = createDiagnoser(makeNegativeRulebook());
		const evaluateCompiled = makePredicateEvaluator(diagnoser.rulebook);
		for (const facts of [
			{},
			{ temp_gauge: null, fan_runs_when_hot: null, loss_l_per_week: null },
			{ fan_circuit_test: 'ok' as ObservationValue }
		]) {
			const engineFired = await diagnoser.evaluateWithEngine(facts);
			const compiledFired = evaluateCompiled(facts);
			for (const [key] of negativeRules) {
				expect(engineFired).not.toContain(`only-${key}`);
				expect(compiledFired).not.toContain(`only-${key}`);
			}
		}
	});

	it('lets the same negative conditions fire once the observation is answered', async () => {
		const diagnoser = createDiagnoser(makeNegativeRulebook());
		const facts = { temp_gauge: 'high_at_speed', fan_runs_when_hot: false, loss_l_per_week: 2 };
		const fired = await diagnoser.evaluateWithEngine(facts);
		for (const [key] of negativeRules) expect(fired).toContain(`only-${key}`);
		expect(makePredicateEvaluator(diagnoser.rulebook)(facts)).toEqual(fired);
	});

	it('would satisfy notEqual in a plain json-rules-engine, which is why the engine is guarded', async () => {
		const plain = new Engine(
			[
				{
					name: 'plain',
					conditions: { all: [{ fact: 'temp_gauge', operator: 'notEqual', value: 'normal' }] },
					event: { type: 'plain' }
				}
			],
			{ allowUndefinedFacts: true }
		);
		const { events } = await plain.run({});
		expect(events.map((event) => event.type)).toEqual(['plain']);
	});

	it('counts as no evidence when it is listed as unknown or answered null', async () => {
		const diagnoser = createDiagnoser(makeNegativeRulebook());
		const empty = await diagnose(diagnoser, { observations: {} });
		const withNulls = await diagnose(diagnoser, {
			observations: { temp_gauge: null, fan_runs_when_hot: null },
			unknown: ['loss_l_per_week']
		});
		expect(withNulls.causes).toEqual(empty.causes);
	});
});

describe('concurrent evaluations', () => {
	it('give the same diagnoses as the same 200 requests run one after another', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const rng = createRng(99);
		const inputs = Array.from({ length: 200 }, () => ({
			observations: makeRandomFacts(diagnoser.rulebook, rng, 0.4)
		}));
		const serial = [];
		for (const input of inputs) serial.push(await diagnose(diagnoser, input));
		const concurrent = await Promise.all(inputs.map((input) => diagnose(diagnoser, input)));
		expect(concurrent).toEqual(serial);
		// The inputs differ enough that equal results are not a coincidence of empty evidence.
		expect(new Set(serial.map((result) => result.causes[0].key)).size).toBeGreaterThan(2);
	});

	it('do not skip rules when one run starts while another is finishing', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const facts = { fan_runs_when_hot: false, temp_gauge: 'high_at_idle', sweet_smell: 'cabin' };
		const expected = await diagnoser.evaluateWithEngine(facts);
		expect(expected.length).toBeGreaterThan(2);
		const firedInDiagnosis = async () =>
			(await diagnoser.analyse({ observations: facts })).firedRules;
		// Start a second run after every possible number of microtask turns of the first one,
		// through the full engine run and through the diagnosis (which skips waiting rules).
		for (let delay = 0; delay < 80; delay++) {
			const first = diagnoser.evaluateWithEngine(facts);
			const second = (async () => {
				for (let turn = 0; turn < delay; turn++) await null;
				return delay % 2 === 0 ? diagnoser.evaluateWithEngine(facts) : firedInDiagnosis();
			})();
			expect(await Promise.all([first, second]), `delay ${delay}`).toEqual([expected, expected]);
		}
	});

	it('would skip rules in one shared plain Engine under the same schedule (the fault guarded against)', async () => {
		const rules = ['a', 'b', 'c', 'd', 'e'].map((name) => ({
			name,
			conditions: { all: [{ fact: 'x', operator: 'equal', value: 1 }] },
			event: { type: name }
		}));
		const plain = new Engine(rules, { allowUndefinedFacts: true });
		let shortRuns = 0;
		for (let delay = 0; delay < 80; delay++) {
			const first = plain.run({ x: 1 });
			const second = (async () => {
				for (let turn = 0; turn < delay; turn++) await null;
				return plain.run({ x: 1 });
			})();
			for (const result of await Promise.all([first, second])) {
				if (result.events.length !== rules.length) shortRuns++;
			}
		}
		expect(shortRuns).toBeGreaterThan(0);
	});
});

describe('the engine pool', () => {
	it('gives each of many overlapping runs an engine set of its own, and builds at most a few', async () => {
		const compiled = compileRulebook(makeCoolingRulebook());
		const engine = buildEngineEvaluator(compiled);
		const rng = createRng(5);
		const inputs = Array.from({ length: 50 }, () =>
			toFactVector(compiled, Object.entries(makeRandomFacts(compiled.rulebook, rng, 0.5)))
		);
		const serial = [];
		for (const facts of inputs) serial.push(await engine.run(facts));
		const concurrent = await Promise.all(inputs.map((facts) => engine.run(facts)));
		expect(concurrent).toEqual(serial);
		expect(engine.setsBuilt).toBe(MAX_ENGINE_SETS);
	});
});
