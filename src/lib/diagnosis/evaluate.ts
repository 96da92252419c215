// An edition compiled for fast lookup, each rule also a plain predicate for the look-ahead.
import type { Evidence } from './rank';
import {
	listConditionFacts,
	type Cause,
	type Condition,
	type ConditionLeaf,
	type ConditionOperator,
	type Observation,
	type ObservationValue,
	type Rule,
	type Rulebook
} from './schema';

/** Answers by observation index (rulebook order); undefined = unanswered. An array rather than
 * a Map because look-ahead reads it thousands of times per request. */
export type FactVector = (ObservationValue | undefined)[];
export type Predicate = (facts: FactVector) => boolean;
/** One byte per rule, in rulebook order: 1 = the rule fired. */
export type FiredMask = Uint8Array;

export interface CompiledRule {
	index: number;
	key: string;
	causeIndex: number;
	lr: number;
	lnLr: number;
	/** Observation keys the rule's conditions mention. */
	facts: string[];
	/** Indices of observations that must all be answered for the rule to fire at all. */
	requiredFacts: number[];
	predicate: Predicate;
	rule: Rule;
	/** What a diagnosis shows when the rule fires; made once, frozen, shared by every result. */
	evidence: Readonly<Evidence>;
}

export interface CompiledRulebook {
	rulebook: Rulebook;
	causes: Cause[];
	causeIndexByKey: Map<string, number>;
	observationsByKey: Map<string, Observation>;
	observationIndexByKey: Map<string, number>;
	rules: CompiledRule[];
	ruleIndexByKey: Map<string, number>;
	/** For look-ahead: only these rules can change when this observation gets an answer. */
	ruleIndicesByObservation: Map<string, number[]>;
	priorLogOdds: Float64Array;
}

// The same comparisons json-rules-engine 7.3.1 makes (engine-default-operators), so that the
// compiled predicates and the engine agree on every input, including odd ones.
function isNumberLike(value: unknown): boolean {
	// parseFloat of a number gives the number back, so only NaN fails; the general path is slower.
	if (typeof value === 'number') return !Number.isNaN(value);
	return Number.parseFloat(value as string).toString() !== 'NaN';
}

type Comparison = (fact: ObservationValue, value: unknown) => boolean;
const COMPARISONS: Record<ConditionOperator, Comparison> = {
	equal: (fact, value) => fact === value,
	notEqual: (fact, value) => fact !== value,
	in: (fact, value) => (value as unknown[]).indexOf(fact) > -1,
	notIn: (fact, value) => (value as unknown[]).indexOf(fact) === -1,
	lessThan: (fact, value) => isNumberLike(fact) && (fact as number) < (value as number),
	lessThanInclusive: (fact, value) => isNumberLike(fact) && (fact as number) <= (value as number),
	greaterThan: (fact, value) => isNumberLike(fact) && (fact as number) > (value as number),
	greaterThanInclusive: (fact, value) => isNumberLike(fact) && (fact as number) >= (value as number)
};

function compileLeaf(leaf: ConditionLeaf, indexOf: (key: string) => number): Predicate {
	const compare = COMPARISONS[leaf.operator];
	const factIndex = indexOf(leaf.fact);
	const value = leaf.value;
	return (facts) => {
		const answer = facts[factIndex];
		// Unanswered is not "no": a missing answer satisfies no leaf, negative ones included.
		if (answer === undefined || answer === null) return false;
		return compare(answer, value);
	};
}

/** Turns a condition tree into a plain closure over its JSON (no eval, no generated code). */
export function compileCondition(
	condition: Condition,
	indexOf: (key: string) => number
): Predicate {
	if ('all' in condition) {
		const members = condition.all.map((member) => compileCondition(member, indexOf));
		return (facts) => {
			for (const member of members) if (!member(facts)) return false;
			return true;
		};
	}
	if ('any' in condition) {
		const members = condition.any.map((member) => compileCondition(member, indexOf));
		return (facts) => {
			for (const member of members) if (member(facts)) return true;
			return false;
		};
	}
	return compileLeaf(condition, indexOf);
}

/** Observations every way of satisfying the condition needs answered (no leaf holds on an
 * unanswered one): all of a group's members' needs, or what all members of an `any` share. */
export function findRequiredFacts(
	condition: Condition,
	indexOf: (key: string) => number
): Set<number> {
	if ('all' in condition) {
		const required = new Set<number>();
		for (const member of condition.all) {
			for (const index of findRequiredFacts(member, indexOf)) required.add(index);
		}
		return required;
	}
	if ('any' in condition) {
		const [first, ...rest] = condition.any.map((member) => findRequiredFacts(member, indexOf));
		return new Set([...first].filter((index) => rest.every((set) => set.has(index))));
	}
	return new Set([indexOf(condition.fact)]);
}

export function logit(probability: number): number {
	return Math.log(probability / (1 - probability));
}

export function compileRulebook(rulebook: Rulebook): CompiledRulebook {
	const causeIndexByKey = new Map(rulebook.causes.map((cause, index) => [cause.key, index]));
	const observationsByKey = new Map(rulebook.observations.map((obs) => [obs.key, obs]));
	const observationIndexByKey = new Map(
		rulebook.observations.map((obs, index) => [obs.key, index])
	);
	const indexOf = (key: string) => {
		const index = observationIndexByKey.get(key);
		if (index === undefined) throw new Error(`unknown observation ${key}`);
		return index;
	};
	const ruleIndicesByObservation = new Map<string, number[]>(
		rulebook.observations.map((obs) => [obs.key, []])
	);
	const rules = rulebook.rules.map((rule, index): CompiledRule => {
		const causeIndex = causeIndexByKey.get(rule.cause);
		if (causeIndex === undefined) throw new Error(`rule ${rule.key}: unknown cause ${rule.cause}`);
		const facts = listConditionFacts(rule.conditions);
		for (const fact of facts) ruleIndicesByObservation.get(fact)?.push(index);
		return {
			index,
			key: rule.key,
			causeIndex,
			lr: rule.lr,
			lnLr: Math.log(rule.lr),
			facts,
			requiredFacts: [...findRequiredFacts(rule.conditions, indexOf)],
			predicate: compileCondition(rule.conditions, indexOf),
			rule,
			evidence: Object.freeze({
				rule: rule.key,
				lr: rule.lr,
				because: rule.rationale,
				source: rule.source
			})
		};
	});
	return {
		rulebook,
		causes: rulebook.causes,
		causeIndexByKey,
		observationsByKey,
		observationIndexByKey,
		rules,
		ruleIndexByKey: new Map(rules.map((rule) => [rule.key, rule.index])),
		ruleIndicesByObservation,
		priorLogOdds: Float64Array.from(rulebook.causes, (cause) => logit(cause.prior))
	};
}

/** Answers of known observations into a FactVector; null, undefined and unknown keys are left out. */
export function toFactVector(
	compiled: CompiledRulebook,
	answers: Iterable<[string, ObservationValue | null | undefined]>
): FactVector {
	const facts: FactVector = new Array(compiled.rulebook.observations.length).fill(undefined);
	for (const [key, value] of answers) {
		const index = compiled.observationIndexByKey.get(key);
		if (index !== undefined && value !== null && value !== undefined) facts[index] = value;
	}
	return facts;
}

export function evaluateCompiled(compiled: CompiledRulebook, facts: FactVector): FiredMask {
	const fired = new Uint8Array(compiled.rules.length);
	for (const rule of compiled.rules) fired[rule.index] = rule.predicate(facts) ? 1 : 0;
	return fired;
}

export function listFiredRuleKeys(compiled: CompiledRulebook, fired: FiredMask): string[] {
	const keys: string[] = [];
	for (let index = 0; index < fired.length; index++) {
		if (fired[index] === 1) keys.push(compiled.rules[index].key);
	}
	return keys;
}
