// The test plan: which confirming tests to do, in order of information per minute.
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
	/** Expected information of the result, in bits per minute of testing (the look-ahead's
	 * expected entropy reduction ÷ minutes); full precision until a response is built. */
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
 * Orders the confirming tests not yet done by expected information per minute, highest first:
 * the look-ahead's expected reduction of the causes' summed entropy if the result were known
 * (`gains`, bits, per observation in rulebook order), divided by the test's minutes.
 *
 * Why not the p/c rule (probability of the causes a test can find ÷ its cost; Kadane and Simon
 * 1977, Heckerman, Breese and Rommelse 1995)? It is optimal when each test finds one fault for
 * sure and faults are exclusive. Here a result is imperfect (a cap can fail its test on a car
 * whose fault is elsewhere), one test moves several causes, and a clearing result is worth as
 * much as a confirming one, which the p/c rule does not count. Information per minute values all
 * of that from the same weights, and puts tests and questions on one scale, so "ask, or test?"
 * compares like with like (see `advice.ts`). A test whose observation is answered or marked
 * unknown is left out. `causeOrder` (cause indices, most probable first) orders each test's targets.
 */
export function planTests(
	compiled: CompiledRulebook,
	testTargets: ReadonlyMap<string, Uint8Array>,
	gains: Float64Array,
	causeOrder: readonly number[],
	isSettled: (observationKey: string) => boolean
): PlannedTest[] {
	const planned: PlannedTest[] = [];
	for (const test of compiled.rulebook.tests) {
		if (isSettled(test.sets)) continue;
		const isTarget = testTargets.get(test.key);
		const targets = causeOrder
			.filter((causeIndex) => isTarget?.[causeIndex] === 1)
			.map((causeIndex) => compiled.causes[causeIndex].key);
		const gain = gains[compiled.observationIndexByKey.get(test.sets) ?? -1];
		planned.push({
			key: test.key,
			name: test.name,
			minutes: test.minutes,
			targets,
			cautions: test.cautions,
			equipment: test.equipment,
			steps: test.steps,
			sets: test.sets,
			score: Number.isFinite(gain) ? gain / test.minutes : 0,
			priority: 0
		});
	}
	planned.sort((a, b) => b.score - a.score || compareKeys(a.key, b.key));
	planned.forEach((test, index) => (test.priority = index + 1));
	return planned;
}
