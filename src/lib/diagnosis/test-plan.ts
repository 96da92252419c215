import type { CompiledRulebook } from './evaluate';
import { compareKeys } from './rank';

export interface PlannedTest {
	key: string;
	name: string;
	minutes: number;
	/** Causes the test can confirm or clear, most probable first. */
	targets: string[];
	/** 1 = do first. */
	priority: number;
	cautions: string[];
	equipment: string[];
	steps: string[];
	sets: string;
	/** Probability mass of the targets per minute; full precision until a response is built. */
	score: number;
}

/**
 * A result "confirms or clears" a cause when one of the cause's rules on that result moves its
 * odds at least threefold either way; a rule that nudges the odds a little does not make the test
 * one for that cause. Common practice, no source: the usual reading of a likelihood ratio of 3
 * or more as moderate evidence.
 */
export const DECISIVE_LR = 3;

/** Per test, which causes (by index) its result can confirm or clear: the causes of the rules
 * whose conditions mention the observation it sets, with a decisive weight; a test with no
 * decisive rule targets every cause its observation touches. */
export function findTestTargets(compiled: CompiledRulebook): Map<string, Uint8Array> {
	const targets = new Map<string, Uint8Array>();
	for (const test of compiled.rulebook.tests) {
		const ruleIndices = compiled.ruleIndicesByObservation.get(test.sets) ?? [];
		const decisive = ruleIndices.filter((i) => {
			const lr = compiled.rules[i].lr;
			return lr >= DECISIVE_LR || lr <= 1 / DECISIVE_LR;
		});
		const isTarget = new Uint8Array(compiled.causes.length);
		for (const ruleIndex of decisive.length ? decisive : ruleIndices) {
			isTarget[compiled.rules[ruleIndex].causeIndex] = 1;
		}
		targets.set(test.key, isTarget);
	}
	return targets;
}

/**
 * Orders the confirming tests still worth doing by (probability mass of their targets) / minutes,
 * highest first: the p/c rule of decision-theoretic troubleshooting. A test whose observation is
 * answered or marked unknown is left out. `causeOrder` is the ranking (cause indices, most
 * probable first), which also orders each test's targets.
 */
export function planTests(
	compiled: CompiledRulebook,
	testTargets: ReadonlyMap<string, Uint8Array>,
	probabilities: Float64Array,
	causeOrder: readonly number[],
	isSettled: (observationKey: string) => boolean
): PlannedTest[] {
	const planned: PlannedTest[] = [];
	for (const test of compiled.rulebook.tests) {
		if (isSettled(test.sets)) continue;
		const isTarget = testTargets.get(test.key);
		const targets: string[] = [];
		let mass = 0;
		for (const causeIndex of causeOrder) {
			if (isTarget?.[causeIndex] !== 1) continue;
			targets.push(compiled.causes[causeIndex].key);
			mass += probabilities[causeIndex];
		}
		planned.push({
			key: test.key,
			name: test.name,
			minutes: test.minutes,
			targets,
			cautions: test.cautions,
			equipment: test.equipment,
			steps: test.steps,
			sets: test.sets,
			score: mass / test.minutes,
			priority: 0
		});
	}
	planned.sort((a, b) => b.score - a.score || compareKeys(a.key, b.key));
	planned.forEach((test, index) => (test.priority = index + 1));
	return planned;
}
