// A rulebook many times the size of another, for benchmarks and scale tests.
import type { Condition, Rulebook, TopLevelCondition } from '../../src/lib/diagnosis/schema';

function renameFacts(condition: Condition, rename: (key: string) => string): Condition {
	if ('all' in condition)
		return { all: condition.all.map((member) => renameFacts(member, rename)) };
	if ('any' in condition)
		return { any: condition.any.map((member) => renameFacts(member, rename)) };
	return { ...condition, fact: rename(condition.fact) };
}

/**
 * A valid rulebook `factor` times the size of `base` for benchmarks: copy 0 is the base itself,
 * copy k renames every cause, observation and test key with `_x<k>` and every rule key with
 * `-x<k>`, its rules pointing at the copy's own causes and observations.
 */
export function makeSyntheticRulebook(base: Rulebook, factor: number): Rulebook {
	if (!Number.isInteger(factor) || factor < 1) throw new Error('factor must be a whole number ≥ 1');
	const copies = Array.from({ length: factor }, (_, copy) => copy);
	const suffix = (key: string, copy: number) => (copy === 0 ? key : `${key}_x${copy}`);
	const ruleSuffix = (key: string, copy: number) => (copy === 0 ? key : `${key}-x${copy}`);
	return {
		meta: { ...base.meta, name: `${base.meta.name} (synthetic ×${factor})` },
		causes: copies.flatMap((copy) =>
			base.causes.map((cause) => ({ ...cause, key: suffix(cause.key, copy) }))
		),
		observations: copies.flatMap((copy) =>
			base.observations.map((observation) => ({
				...observation,
				key: suffix(observation.key, copy)
			}))
		),
		rules: copies.flatMap((copy) =>
			base.rules.map((rule) => ({
				...rule,
				key: ruleSuffix(rule.key, copy),
				cause: suffix(rule.cause, copy),
				conditions: renameFacts(rule.conditions, (key) => suffix(key, copy)) as TopLevelCondition
			}))
		),
		tests: copies.flatMap((copy) =>
			base.tests.map((test) => ({
				...test,
				key: suffix(test.key, copy),
				sets: suffix(test.sets, copy)
			}))
		)
	};
}
