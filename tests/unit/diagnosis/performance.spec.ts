import { describe, expect, it } from 'vitest';
import { makeRandomRulebook } from './factories';
import { measureCosts } from './measure';

// Loose bounds, many times above what a busy two-core machine measures, so the test fails only
// when the design regresses (for example look-ahead running the engine once per answer, which
// costs about a millisecond per run on a 100-rule rulebook).
describe('cost per case on a 100-rule rulebook', () => {
	it('keeps compiled evaluation, look-ahead and a compiled diagnosis well under a millisecond', async () => {
		const costs = await measureCosts('random, 100 rules', makeRandomRulebook(5), 100);
		console.info(
			`engine.run ${costs.engineRunMicros.toFixed(0)} µs, compiled ${costs.compiledEvaluateMicros.toFixed(1)} µs, ` +
				`next-question ${costs.nextQuestionMicros.toFixed(0)} µs, diagnose engine ${costs.diagnoseEngineMicros.toFixed(0)} µs, ` +
				`diagnose compiled ${costs.diagnoseCompiledMicros.toFixed(0)} µs`
		);
		expect(costs.compiledEvaluateMicros).toBeLessThan(200);
		expect(costs.nextQuestionMicros).toBeLessThan(2000);
		expect(costs.diagnoseCompiledMicros).toBeLessThan(4000);
		// Look-ahead must cost less than running the engine for every hypothetical answer would.
		expect(costs.nextQuestionMicros).toBeLessThan(costs.engineRunMicros * 10);
	}, 60_000);
});
