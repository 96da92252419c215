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

/** Per test, the causes of every rule whose conditions mention the observation it sets. */
export function findTestTargets(compiled: CompiledRulebook): Map<string, number[]> {
	const targets = new Map<string, number[]>();
	for (const test of compiled.rulebook.tests) {
		const causeIndices = new Set<number>();
		for (const ruleIndex of compiled.ruleIndicesByObservation.get(test.sets) ?? []) {
			causeIndices.add(compiled.rules[ruleIndex].causeIndex);
		}
		targets.set(test.key, [...causeIndices]);
	}
	return targets;
}

/**
 * Orders the confirming tests still worth doing by (probability mass of their targets) / minutes,
 * highest first: the p/c rule of decision-theoretic troubleshooting. A test whose observation is
 * answered or marked unknown is left out.
 */
export function planTests(
	compiled: CompiledRulebook,
	testTargets: ReadonlyMap<string, number[]>,
	probabilities: Float64Array,
	isSettled: (observationKey: string) => boolean
): PlannedTest[] {
	const planned: Omit<PlannedTest, 'priority'>[] = [];
	for (const test of compiled.rulebook.tests) {
		if (isSettled(test.sets)) continue;
		const causeIndices = [...(testTargets.get(test.key) ?? [])].sort(
			(a, b) =>
				probabilities[b] - probabilities[a] ||
				compareKeys(compiled.causes[a].key, compiled.causes[b].key)
		);
		const mass = causeIndices.reduce((sum, index) => sum + probabilities[index], 0);
		planned.push({
			key: test.key,
			name: test.name,
			minutes: test.minutes,
			targets: causeIndices.map((index) => compiled.causes[index].key),
			cautions: test.cautions,
			equipment: test.equipment,
			steps: test.steps,
			sets: test.sets,
			score: mass / test.minutes
		});
	}
	planned.sort((a, b) => b.score - a.score || compareKeys(a.key, b.key));
	return planned.map((test, index) => ({ ...test, priority: index + 1 }));
}
