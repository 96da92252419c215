import { describe, expect, it } from 'vitest';
import { parseRulebook, type Rulebook } from '../../../src/lib/diagnosis/schema';
import {
	makeBooleanObservation,
	makeCause,
	makeCoolingRulebook,
	makeRandomRulebook,
	makeRule,
	makeRulebook,
	makeTest
} from './factories';

// Mutations write invalid shapes on purpose, which no precise type would allow.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type LooseRulebook = Record<string, any>;
type Mutation = (rulebook: LooseRulebook) => void;

function expectIssue(mutate: Mutation, path: string, messagePart: string | RegExp) {
	const rulebook = structuredClone(makeRulebook()) as LooseRulebook;
	mutate(rulebook);
	const result = parseRulebook(rulebook);
	expect(result.ok).toBe(false);
	if (result.ok) return;
	const atPath = result.issues.filter((issue) => issue.path === path);
	expect(atPath, JSON.stringify(result.issues)).not.toHaveLength(0);
	expect(atPath.map((issue) => issue.message).join(' | ')).toMatch(messagePart);
}

describe('rulebookSchema', () => {
	it('accepts the small fixture, the cooling fixture and random rulebooks', () => {
		expect(parseRulebook(makeRulebook())).toMatchObject({ ok: true });
		expect(parseRulebook(makeCoolingRulebook())).toMatchObject({ ok: true });
		for (const seed of [1, 2, 3])
			expect(parseRulebook(makeRandomRulebook(seed))).toMatchObject({ ok: true });
	});

	it('fills defaults for optional lists', () => {
		const rulebook = structuredClone(makeRulebook()) as LooseRulebook;
		delete rulebook.causes[0].cautions;
		delete rulebook.observations[0].phrases;
		const result = parseRulebook(rulebook);
		expect(result.ok && result.rulebook.causes[0].cautions).toEqual([]);
		expect(result.ok && result.rulebook.observations[0].phrases).toEqual([]);
	});

	it('rejects an unknown observation in a condition, at the leaf fact', () => {
		expectIssue(
			(rb) => (rb.rules[0].conditions.all[0].fact = 'fan_speed'),
			'rules[0].conditions.all[0].fact',
			'unknown observation "fan_speed"'
		);
	});

	it('rejects an unknown observation deep in nested all/any', () => {
		expectIssue(
			(rb) =>
				(rb.rules[1].conditions = {
					any: [
						{ fact: 'temp_gauge', operator: 'equal', value: 'normal' },
						{ all: [{ fact: 'no_such_thing', operator: 'equal', value: true }] }
					]
				}),
			'rules[1].conditions.any[1].all[0].fact',
			'unknown observation'
		);
	});

	it('rejects a value outside an enum and lists the allowed values', () => {
		expectIssue(
			(rb) => (rb.rules[3].conditions.all[0].value = 'hot'),
			'rules[3].conditions.all[0].value',
			/"hot" is not one of temp_gauge's values \(normal, high_at_idle, high_at_speed\)/
		);
	});

	it('rejects a value of the wrong kind', () => {
		expectIssue(
			(rb) => (rb.rules[0].conditions.all[0].value = 'no'),
			'rules[0].conditions.all[0].value',
			'not a boolean'
		);
	});

	it('rejects a wrong value inside an in-list, at its index', () => {
		expectIssue(
			(rb) =>
				(rb.rules[3].conditions.all[0] = {
					fact: 'temp_gauge',
					operator: 'in',
					value: ['normal', 'boiling']
				}),
			'rules[3].conditions.all[0].value[1]',
			'"boiling" is not one of'
		);
	});

	it('rejects a number value outside the observation range', () => {
		expectIssue(
			(rb) =>
				(rb.rules[4].conditions = {
					all: [{ fact: 'loss_l_per_week', operator: 'greaterThan', value: 80 }]
				}),
			'rules[4].conditions.all[0].value',
			'outside loss_l_per_week'
		);
	});

	it('rejects a number operator on an enum observation', () => {
		expectIssue(
			(rb) =>
				(rb.rules[3].conditions.all[0] = {
					fact: 'temp_gauge',
					operator: 'greaterThan',
					value: 'normal'
				}),
			'rules[3].conditions.all[0].operator',
			'needs a number observation'
		);
	});

	it('rejects an operator json-rules-engine has but the rulebook does not allow', () => {
		expectIssue(
			(rb) => (rb.rules[0].conditions.all[0].operator = 'contains'),
			'rules[0].conditions.all[0].operator',
			'is not one of'
		);
	});

	it('rejects in/notIn without an array', () => {
		expectIssue(
			(rb) => (rb.rules[0].conditions.all[0].operator = 'notIn'),
			'rules[0].conditions.all[0].value',
			'non-empty array'
		);
	});

	it('rejects "not" at any depth', () => {
		expectIssue(
			(rb) =>
				(rb.rules[0].conditions = {
					all: [{ not: { fact: 'fan_runs_when_hot', operator: 'equal', value: true } }]
				}),
			'rules[0].conditions.all[0].not',
			'"not" is not allowed'
		);
		expectIssue(
			(rb) =>
				(rb.rules[0].conditions = {
					not: { fact: 'fan_runs_when_hot', operator: 'equal', value: true }
				}),
			'rules[0].conditions.not',
			'"not" is not allowed'
		);
	});

	it('rejects a bare leaf as the top-level condition and nesting deeper than three', () => {
		expectIssue(
			(rb) =>
				(rb.rules[0].conditions = { fact: 'fan_runs_when_hot', operator: 'equal', value: false }),
			'rules[0].conditions',
			'"all"'
		);
		const leaf = { fact: 'fan_runs_when_hot', operator: 'equal', value: false };
		expectIssue(
			(rb) => (rb.rules[0].conditions = { all: [{ any: [{ all: [{ any: [leaf] }] }] }] }),
			'rules[0].conditions.all[0].any[0].all[0]',
			'at most 3 levels'
		);
	});

	it('rejects extra keys on a condition leaf (path would change what the engine reads)', () => {
		expectIssue(
			(rb) => (rb.rules[0].conditions.all[0].path = '$.x'),
			'rules[0].conditions.all[0].path',
			'not allowed'
		);
	});

	it('rejects lr at or below 0, equal to 1, and outside [0.01, 100]', () => {
		expectIssue((rb) => (rb.rules[0].lr = 0), 'rules[0].lr', 'above 0');
		expectIssue((rb) => (rb.rules[0].lr = -2), 'rules[0].lr', 'above 0');
		expectIssue((rb) => (rb.rules[0].lr = 1), 'rules[0].lr', 'must not be 1');
		expectIssue((rb) => (rb.rules[0].lr = 150), 'rules[0].lr', 'between 0.01 and 100');
		expectIssue((rb) => (rb.rules[1].lr = 0.005), 'rules[1].lr', 'between 0.01 and 100');
	});

	it('accepts lr exactly at the bounds 0.01 and 100', () => {
		const rulebook = makeRulebook();
		rulebook.rules[0].lr = 100;
		rulebook.rules[1].lr = 0.01;
		expect(parseRulebook(rulebook)).toMatchObject({ ok: true });
	});

	it('rejects a test that sets an unknown observation', () => {
		expectIssue(
			(rb) => (rb.tests[0].sets = 'fan_relay_test'),
			'tests[0].sets',
			'unknown observation'
		);
	});

	it('rejects a test_result observation no test sets', () => {
		expectIssue((rb) => (rb.tests = []), 'observations[3].group', 'no confirming test sets it');
	});

	it('rejects a rule for an unknown cause', () => {
		expectIssue(
			(rb) => (rb.rules[3].cause = 'gremlins'),
			'rules[3].cause',
			'unknown cause "gremlins"'
		);
	});

	it('rejects duplicate keys of causes, observations, rules, tests and enum values', () => {
		expectIssue((rb) => rb.causes.push(makeCause()), 'causes[2].key', 'duplicate cause key');
		expectIssue(
			(rb) => rb.observations.push(makeBooleanObservation()),
			'observations[4].key',
			'duplicate observation key'
		);
		expectIssue((rb) => rb.rules.push(makeRule()), 'rules[5].key', 'duplicate rule key');
		expectIssue((rb) => rb.tests.push(makeTest()), 'tests[1].key', 'duplicate test key');
		expectIssue(
			(rb) => (rb.observations[1].values = ['normal', 'high_at_idle', 'normal']),
			'observations[1].values[2]',
			'duplicate enum value "normal"'
		);
	});

	it('rejects a cause that no rule supports', () => {
		expectIssue(
			(rb) =>
				(rb.rules = rb.rules.filter(
					(rule: { cause: string }) => rule.cause !== 'thermostat_stuck_closed'
				)),
			'causes[1].key',
			'no rule supports cause "thermostat_stuck_closed"'
		);
		// Only arguing-against rules still leave the cause unsupported.
		expectIssue(
			(rb) =>
				(rb.rules = rb.rules.filter(
					(rule: { key: string }) => rule.key !== 'hot-at-speed-not-idle'
				)),
			'causes[1].key',
			'no rule supports'
		);
	});

	it('rejects frequencies that do not sum to 1, miss a value or name a non-value', () => {
		expectIssue(
			(rb) => (rb.observations[0].frequencies = { true: 0.7, false: 0.4 }),
			'observations[0].frequencies',
			'sum to 1'
		);
		expectIssue(
			(rb) => (rb.observations[1].frequencies = { normal: 0.6, high_at_idle: 0.4 }),
			'observations[1].frequencies',
			'frequency of "high_at_speed" is missing'
		);
		expectIssue(
			(rb) =>
				(rb.observations[1].frequencies = {
					normal: 0.4,
					high_at_idle: 0.35,
					high_at_speed: 0.2,
					hot: 0.05
				}),
			'observations[1].frequencies.hot',
			'not a value'
		);
	});

	it('accepts frequencies within ±0.01 of 1', () => {
		const rulebook = makeRulebook();
		rulebook.observations[0] = makeBooleanObservation({ frequencies: { true: 0.705, false: 0.3 } });
		expect(parseRulebook(rulebook)).toMatchObject({ ok: true });
	});

	it('rejects bins that do not sum to 1 or lie outside the range', () => {
		expectIssue(
			(rb) => (rb.observations[2].bins[0].frequency = 0.1),
			'observations[2].bins',
			'bin frequencies must sum to 1'
		);
		expectIssue(
			(rb) => (rb.observations[2].bins[2].value = 60),
			'observations[2].bins[2].value',
			'outside'
		);
	});

	it('rejects bands that are not ordered 0 < possible < likely < 1', () => {
		expectIssue(
			(rb) => (rb.meta.bands = { likely: 0.2, possible: 0.3 }),
			'meta.bands.possible',
			'ordered'
		);
		expectIssue((rb) => (rb.meta.bands = { likely: 1, possible: 0.3 }), 'meta.bands.likely', /1/);
	});

	it('rejects a prior at or above the likely band', () => {
		expectIssue((rb) => (rb.causes[0].prior = 0.6), 'causes[0].prior', 'below bands.likely');
		expectIssue((rb) => (rb.causes[0].prior = 0), 'causes[0].prior', 'above 0');
	});

	it('rejects a phrase value that is not a value of its observation', () => {
		expectIssue(
			(rb) => (rb.observations[0].phrases = [{ text: 'fan never comes on', value: 'no' }]),
			'observations[0].phrases[0].value',
			'not a boolean'
		);
		expectIssue(
			(rb) => (rb.observations[1].phrases = [{ text: 'hot in traffic', value: 'idle' }]),
			'observations[1].phrases[0].value',
			'"idle" is not one of'
		);
		expectIssue(
			(rb) => (rb.observations[2].phrases = [{ text: 'a bucket a day', value: 70 }]),
			'observations[2].phrases[0].value',
			'outside'
		);
		expectIssue(
			(rb) => (rb.observations[0].phrases = [{ text: 'Fan Never Comes On', value: false }]),
			'observations[0].phrases[0].text',
			'lower-case'
		);
	});

	it('rejects bad key shapes', () => {
		expectIssue((rb) => (rb.causes[0].key = 'CoolingFan'), 'causes[0].key', 'snake_case');
		expectIssue((rb) => (rb.rules[0].key = 'fan_off'), 'rules[0].key', 'kebab-case');
	});

	it('reports several issues at once, each with its own path', () => {
		const rulebook = structuredClone(makeRulebook()) as LooseRulebook;
		rulebook.rules[0].conditions.all[0].fact = 'nope';
		rulebook.rules[3].conditions.all[0].value = 'hot';
		rulebook.tests[0].sets = 'missing';
		const result = parseRulebook(rulebook);
		expect(result.ok).toBe(false);
		// The fan circuit result is then set by no test: a fourth, consequent issue.
		expect(!result.ok && result.issues.map((issue) => issue.path).sort()).toEqual([
			'observations[3].group',
			'rules[0].conditions.all[0].fact',
			'rules[3].conditions.all[0].value',
			'tests[0].sets'
		]);
	});

	it('returns a complete rulebook unchanged', () => {
		const input: Rulebook = makeCoolingRulebook();
		const result = parseRulebook(input);
		expect(result.ok && result.rulebook).toEqual(input);
	});
});
