// json-rules-engine as the diagnosis runs it: decides which rules fire on a set of answers.
import { Almanac, Engine, OperatorDecorator, type Event } from 'json-rules-engine';
import type { CompiledRule, CompiledRulebook, FactVector, FiredMask } from './evaluate';
import type { Condition, ConditionOperator, TopLevelCondition } from './schema';

// Every leaf runs through this decorator, so an unanswered fact (undefined, since
// allowUndefinedFacts is on) fails the leaf before notEqual/notIn can call it a match.
const ANSWERED_DECORATOR = 'answered';

function guardCondition(condition: Condition): Condition {
	if ('all' in condition) return { all: condition.all.map(guardCondition) };
	if ('any' in condition) return { any: condition.any.map(guardCondition) };
	return {
		fact: condition.fact,
		operator: `${ANSWERED_DECORATOR}:${condition.operator}` as ConditionOperator,
		value: condition.value
	};
}

/** A rule has a chance to fire only when every observation it requires is answered. */
export function canRuleFire(rule: CompiledRule, facts: FactVector): boolean {
	for (const required of rule.requiredFacts) if (facts[required] === undefined) return false;
	return true;
}

/** Rules with no single observation every way of firing needs: run on every evaluation. */
const ALWAYS = -1;

/**
 * The observation a rule waits for: one it requires (the one with the fewest rules waiting on it,
 * so the groups stay small), or ALWAYS when it requires none.
 */
function chooseGate(rule: CompiledRule, requiredCounts: readonly number[]): number {
	let gate = ALWAYS;
	for (const required of rule.requiredFacts) {
		if (gate === ALWAYS || requiredCounts[required] < requiredCounts[gate]) gate = required;
	}
	return gate;
}

/** The edition's rules, grouped by the observation each waits for. */
interface RuleGroup {
	gate: number;
	rules: CompiledRule[];
}

function groupRules(compiled: CompiledRulebook): RuleGroup[] {
	const requiredCounts = new Array<number>(compiled.rulebook.observations.length).fill(0);
	for (const rule of compiled.rules)
		for (const index of rule.requiredFacts) requiredCounts[index]++;
	const byGate = new Map<number, CompiledRule[]>();
	for (const rule of compiled.rules) {
		const gate = chooseGate(rule, requiredCounts);
		const rules = byGate.get(gate);
		if (rules) rules.push(rule);
		else byGate.set(gate, [rule]);
	}
	return [...byGate].map(([gate, rules]) => ({ gate, rules }));
}

function buildEngine(rules: readonly CompiledRule[]): Engine {
	const engine = new Engine([], { allowUndefinedFacts: true });
	engine.addOperatorDecorator(
		new OperatorDecorator(
			ANSWERED_DECORATOR,
			(factValue: unknown, jsonValue: unknown, next: (a: unknown, b: unknown) => boolean) =>
				next(factValue, jsonValue),
			(factValue: unknown) => factValue !== undefined && factValue !== null
		)
	);
	for (const rule of rules) {
		engine.addRule({
			name: rule.key,
			// One priority level: a run's rules are evaluated as one set.
			priority: 1,
			conditions: guardCondition(rule.rule.conditions) as TopLevelCondition as never,
			event: { type: rule.key }
		});
	}
	return engine;
}

/** One Engine per rule group; a run has a set to itself. */
type EngineSet = { gate: number; engine: Engine }[];

/** Engine sets kept per edition; more concurrent runs wait for one to come free. */
export const MAX_ENGINE_SETS = 4;

export interface EngineEvaluator {
	/**
	 * Runs json-rules-engine on the answers. With `skipWaitingRules`, the engines of rules that
	 * wait for an unanswered observation (one every way of satisfying them needs) are not run:
	 * the result is the same, the run cheaper.
	 */
	run(facts: FactVector, options?: { skipWaitingRules?: boolean }): Promise<FiredMask>;
	/** Engine sets built so far (at most MAX_ENGINE_SETS). */
	readonly setsBuilt: number;
}

/**
 * Builds the json-rules-engine Engines of an edition. Concurrent runs on one Engine can skip
 * rules (the engine keeps its run status on the instance, and a run that finishes makes another
 * in-flight run skip what it has left), so each run takes an engine set of its own from a small
 * pool, built on first need.
 */
export function buildEngineEvaluator(compiled: CompiledRulebook): EngineEvaluator {
	const groups = groupRules(compiled);
	const idle: EngineSet[] = [];
	const waiting: ((set: EngineSet) => void)[] = [];
	let setsBuilt = 0;
	const observationKeys = compiled.rulebook.observations.map((observation) => observation.key);
	const ruleIndexByKey = compiled.ruleIndexByKey;

	function acquire(): EngineSet | Promise<EngineSet> {
		const set = idle.pop();
		if (set) return set;
		if (setsBuilt < MAX_ENGINE_SETS) {
			setsBuilt++;
			return groups.map(({ gate, rules }) => ({ gate, engine: buildEngine(rules) }));
		}
		return new Promise((resolve) => waiting.push(resolve));
	}

	function release(set: EngineSet) {
		const next = waiting.shift();
		if (next) next(set);
		else idle.push(set);
	}

	async function runSet(set: EngineSet, facts: FactVector, skip: boolean): Promise<Event[][]> {
		// One almanac for the run, shared by the set's engines: the answers are added once.
		const almanac = new Almanac({ allowUndefinedFacts: true });
		facts.forEach((value, index) => {
			if (value !== undefined && value !== null)
				almanac.addRuntimeFact(observationKeys[index], value);
		});
		const runs = set
			.filter(({ gate }) => !skip || gate === ALWAYS || facts[gate] !== undefined)
			.map(({ engine }) => engine.run({}, { almanac }));
		return (await Promise.all(runs)).map((result) => result.events);
	}

	return {
		get setsBuilt() {
			return setsBuilt;
		},
		async run(facts, options = {}) {
			const set = await acquire();
			let events: Event[][];
			try {
				events = await runSet(set, facts, options.skipWaitingRules ?? false);
			} finally {
				release(set);
			}
			const fired = new Uint8Array(compiled.rules.length);
			for (const list of events) {
				for (const event of list) {
					const index = ruleIndexByKey.get(event.type);
					if (index !== undefined) fired[index] = 1;
				}
			}
			return fired;
		}
	};
}
