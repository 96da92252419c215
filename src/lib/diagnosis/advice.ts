// When to stop asking: which questions are worth their time, and whether the next step is a test.
import type { CompiledRulebook } from './evaluate';
import { roundGainBits } from './next-question';
import type { PlannedTest } from './test-plan';

export interface Advice {
	/** True when no question left is worth asking: do `bestTest` next. */
	stop: boolean;
	reason: string;
	/** Key of the plan's first test, or null when none is left. */
	bestTest: string | null;
}

/**
 * A question whose expected gain is below this is not worth asking, whatever it costs: 0.05 bits
 * is what a yes/no answer tells when it can be guessed right 199 times in 200 (the binary
 * entropy of 0.6 % is 0.05 bits). The questions the issue of stopping was raised on gained 0.04
 * and 0.00 bits.
 */
export const MIN_QUESTION_GAIN_BITS = 0.05;

/** What a question costs when no test sets it: asking at the counter or a glance under the
 * bonnet. Common practice, no source. */
export const QUESTION_MINUTES = 1;

export interface StepAdvice {
	advice: Advice;
	/** Observation indices of the unanswered observations not worth their time. */
	lowValue: Set<number>;
}

/** Minutes to settle each observation: its test's minutes when a test sets it. */
export function findObservationMinutes(compiled: CompiledRulebook): Float64Array {
	const minutes = new Float64Array(compiled.rulebook.observations.length).fill(QUESTION_MINUTES);
	for (const test of compiled.rulebook.tests) {
		const index = compiled.observationIndexByKey.get(test.sets);
		if (index !== undefined) minutes[index] = test.minutes;
	}
	return minutes;
}

/**
 * An unanswered observation is low value when it gains less than `MIN_QUESTION_GAIN_BITS`, or
 * less information per minute than the plan's first test (questions and tests measured alike:
 * the look-ahead's bits over minutes). The advice is to stop asking when every question that no
 * test sets is low value; the next step is then the best test.
 */
export function adviseNextStep(
	compiled: CompiledRulebook,
	gains: Float64Array,
	minutes: Float64Array,
	tests: readonly PlannedTest[]
): StepAdvice {
	const observations = compiled.rulebook.observations;
	const bestTest = tests[0];
	const testRate = bestTest?.score ?? 0;
	const lowValue = new Set<number>();
	let bestQuestion = -1;
	for (let index = 0; index < observations.length; index++) {
		const gain = gains[index];
		if (Number.isNaN(gain)) continue;
		if (gain < MIN_QUESTION_GAIN_BITS || gain / minutes[index] < testRate) {
			lowValue.add(index);
		} else if (!isSetByTest(compiled, index)) {
			if (bestQuestion < 0 || gain > gains[bestQuestion]) bestQuestion = index;
		}
	}
	const bestTestKey = bestTest?.key ?? null;
	const rate = `${roundGainBits(testRate)} bits a minute`;
	if (bestQuestion >= 0) {
		const question = observations[bestQuestion].key;
		const gain = roundGainBits(gains[bestQuestion]);
		const against = bestTest ? `, against ${rate} for the best test` : '';
		return {
			lowValue,
			advice: {
				stop: false,
				reason: `Questions are still worth asking: "${question}" is expected to give ${gain} bits for a minute${against}.`,
				bestTest: bestTestKey
			}
		};
	}
	const reason = !bestTest
		? 'No question or test left is worth its time.'
		: bestTest.score * bestTest.minutes < MIN_QUESTION_GAIN_BITS
			? `Nothing left is expected to move the ranking by ${MIN_QUESTION_GAIN_BITS} bits; if a test is still wanted, "${bestTest.name}" is the best.`
			: `No question left is worth its minute (each gives under ${MIN_QUESTION_GAIN_BITS} bits, or less per minute than testing): do "${bestTest.name}" next (${rate}).`;
	return { lowValue, advice: { stop: true, reason, bestTest: bestTestKey } };
}

function isSetByTest(compiled: CompiledRulebook, observationIndex: number): boolean {
	const key = compiled.rulebook.observations[observationIndex].key;
	return compiled.rulebook.tests.some((test) => test.sets === key);
}
