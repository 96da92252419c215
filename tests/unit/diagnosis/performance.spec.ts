import { Engine } from 'json-rules-engine';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import { createRng, diagnose, makeRandomFacts, makeRandomRulebook } from './factories';

// Speed itself is measured by `npm run bench`; these tests pin down the design that makes it fast:
// ranking the next question must not run the whole engine once per hypothetical answer.
describe('work done per diagnosis', () => {
	afterEach(() => vi.restoreAllMocks());

	it('runs json-rules-engine once per diagnosis, not once per hypothetical answer', async () => {
		const rulebook = makeRandomRulebook(5);
		const diagnoser = createDiagnoser(rulebook);
		const observations = makeRandomFacts(rulebook, createRng(8), 0.3);
		const run = vi.spyOn(Engine.prototype, 'run');
		await diagnoser.evaluateWithEngine(observations, { skipWaitingRules: true });
		// One evaluation runs the engines of the rule groups whose observation is answered.
		const runsPerEvaluation = run.mock.calls.length;
		expect(runsPerEvaluation).toBeGreaterThan(0);
		run.mockClear();
		const result = await diagnose(diagnoser, { observations });
		expect(result.nextQuestions.length).toBeGreaterThan(5);
		expect(run).toHaveBeenCalledTimes(runsPerEvaluation);
	});

	it('leaves out the engines of rules waiting for an unanswered observation', async () => {
		const rulebook = makeRandomRulebook(5);
		const diagnoser = createDiagnoser(rulebook);
		const observations = makeRandomFacts(rulebook, createRng(9), 0.2);
		const run = vi.spyOn(Engine.prototype, 'run');
		const full = await diagnoser.evaluateWithEngine(observations);
		const fullRuns = run.mock.calls.length;
		run.mockClear();
		expect(await diagnoser.evaluateWithEngine(observations, { skipWaitingRules: true })).toEqual(
			full
		);
		expect(run.mock.calls.length).toBeLessThan(fullRuns);
	});
});
