import { describe, expect, it } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import {
	diagnose,
	createRng,
	makeCoolingRulebook,
	makeRandomFacts,
	makeRandomRulebook,
	makeRule,
	makeRulebook
} from './factories';

describe('test plan', () => {
	it('derives each test’s targets from the rules that mention what it sets', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const { tests } = await diagnoser.analyse({ observations: {} });
		const targets = Object.fromEntries(tests.map((test) => [test.key, [...test.targets].sort()]));
		expect(targets).toEqual({
			fan_circuit_check: ['cooling_fan_fault'],
			pressure_test_system: ['head_gasket_breach', 'hose_or_clamp_leak'],
			combustion_gas_check: ['head_gasket_breach'],
			cap_check: ['pressure_cap_fault']
		});
	});

	it('counts a cause as a target only when the result moves its odds threefold or more', async () => {
		const base = makeRulebook();
		const rulebook = {
			...base,
			rules: [
				...base.rules,
				// A nudge (×1.3) for the thermostat does not make the fan check a thermostat test.
				makeRule({
					key: 'fan-fault-nudges-thermostat',
					cause: 'thermostat_stuck_closed',
					lr: 1.3,
					conditions: {
						all: [{ fact: 'fan_circuit_test', operator: 'equal', value: 'fault_found' }]
					}
				})
			]
		};
		const { tests } = await createDiagnoser(rulebook).analyse({ observations: {} });
		expect(tests[0].targets).toEqual(['cooling_fan_fault']);
	});

	it('orders tests by the expected information of their result per minute, priority 1 first', async () => {
		for (const seed of [71, 72, 73]) {
			const diagnoser = createDiagnoser(makeRandomRulebook(seed));
			const rng = createRng(seed);
			for (let run = 0; run < 10; run++) {
				const analysis = await diagnoser.analyse({
					observations: makeRandomFacts(diagnoser.rulebook, rng, 0.3)
				});
				// analyse describes every unanswered observation, test results included.
				const gain = new Map(analysis.nextQuestions.map((q) => [q.key, q.expectedGain]));
				const scores = analysis.tests.map((test) => (gain.get(test.sets) as number) / test.minutes);
				analysis.tests.forEach((test, index) => {
					expect(test.priority).toBe(index + 1);
					expect(test.score).toBeCloseTo(scores[index], 12);
					if (index > 0) {
						const previous = analysis.tests[index - 1];
						expect(
							scores[index - 1] > scores[index] ||
								(scores[index - 1] === scores[index] && previous.key < test.key)
						).toBe(true);
					}
				});
			}
		}
	});

	it('scores a test by its expected entropy reduction per minute (hand-worked)', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const { tests } = await diagnoser.analyse({ observations: {} });
		// Cap test, 10 min, moves only the cap (prior 0.06; fails ×20 in 20 % of cars, holds ×0.1
		// in 80 %). h(0.06) = 0.32744 bits; fails: odds 0.06/0.94 × 20 → p 0.56075, h 0.98932;
		// holds: p 0.0063425, h 0.055426. Gain 0.2 × (0.32744 − 0.98932) + 0.8 × (0.32744 −
		// 0.055426) = 0.085235 bits, 0.0085235 bits a minute: the best of the four.
		expect(tests[0].key).toBe('cap_check');
		expect(tests[0].score).toBeCloseTo(0.0085235, 6);
		// The pressure test's answers, at their base rates, leave the causes less certain on
		// average than now: it goes last until the evidence makes its result worth knowing.
		expect(tests.at(-1)?.key).toBe('pressure_test_system');
		const suspicious = await diagnoser.analyse({
			observations: {
				exhaust_smoke: 'white_persistent',
				level_drops_between_checks: true,
				puddle_under_vehicle: false
			}
		});
		const order = suspicious.tests.map((test) => test.key);
		expect(order.indexOf('combustion_gas_check')).toBeLessThan(order.indexOf('cap_check'));
	});

	it('leaves out tests whose result is answered or unknown', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const { tests } = await diagnose(diagnoser, {
			observations: { cap_test: 'holds_rating', pressure_test: null },
			unknown: ['combustion_gas_test']
		});
		expect(tests.map((test) => test.key).sort()).toEqual([
			'fan_circuit_check',
			'pressure_test_system'
		]);
	});

	it('returns what a technician needs to run the test', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const { tests } = await diagnose(diagnoser, { observations: {} });
		const pressure = tests.find((test) => test.key === 'pressure_test_system');
		expect(pressure).toMatchObject({
			name: 'Cooling system pressure test',
			minutes: 20,
			equipment: ['Cooling system pressure tester'],
			cautions: ['Never open the cap on a hot, pressurised system.'],
			sets: 'pressure_test'
		});
		expect(pressure?.steps?.length).toBeGreaterThan(0);
		const brief = await diagnose(diagnoser, { observations: {} }, { testSteps: false });
		expect(brief.tests.map((test) => test.key)).toEqual(tests.map((test) => test.key));
		expect(brief.tests.every((test) => test.steps === undefined)).toBe(true);
	});
});

describe('cautions of a diagnosis', () => {
	it('joins the rulebook’s cautions, the likely causes’ and the first tests’, without repeats', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const quiet = await diagnose(diagnoser, { observations: {} });
		expect(quiet.cautions[0]).toBe('Let the engine cool before opening the cooling system.');
		expect(quiet.cautions).not.toContain(
			'Do not keep driving an engine that is pushing coolant out.'
		);
		const suspicious = await diagnose(diagnoser, {
			observations: {
				exhaust_smoke: 'white_persistent',
				level_drops_between_checks: true,
				puddle_under_vehicle: false
			}
		});
		expect(suspicious.causes[0]).toMatchObject({ key: 'head_gasket_breach', band: 'likely' });
		expect(suspicious.cautions).toContain(
			'Do not keep driving an engine that is pushing coolant out.'
		);
		for (const test of suspicious.tests.slice(0, 3)) {
			for (const caution of test.cautions) expect(suspicious.cautions).toContain(caution);
		}
		expect(new Set(suspicious.cautions).size).toBe(suspicious.cautions.length);
	});
});
