import { Engine } from 'json-rules-engine';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import { makeRandomRulebook } from './factories';

// Speed itself is measured by `npm run bench`; these tests pin down the design that makes it fast:
// ranking the next question must not run the whole engine once per hypothetical answer.
describe('work done per diagnosis', () => {
	afterEach(() => vi.restoreAllMocks());

	it('runs json-rules-engine exactly once per diagnosis, however many questions remain', async () => {
		const rulebook = makeRandomRulebook(5);
		const diagnoser = createDiagnoser(rulebook, { evaluator: 'engine' });
		const run = vi.spyOn(Engine.prototype, 'run');
		const result = await diagnoser.diagnose({ observations: {} });
		expect(result.nextQuestions.length).toBeGreaterThan(5);
		expect(run).toHaveBeenCalledTimes(1);
	});

	it('never runs json-rules-engine with the compiled evaluator', async () => {
		const diagnoser = createDiagnoser(makeRandomRulebook(5), { evaluator: 'compiled' });
		const run = vi.spyOn(Engine.prototype, 'run');
		const result = await diagnoser.diagnose({ observations: {} });
		expect(result.causes.length).toBeGreaterThan(0);
		expect(run).not.toHaveBeenCalled();
	});
});
