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

	it('orders tests by probability of their targets per minute (p/c), priority 1 first', async () => {
		for (const seed of [71, 72, 73]) {
			const diagnoser = createDiagnoser(makeRandomRulebook(seed));
			const rng = createRng(seed);
			for (let run = 0; run < 10; run++) {
				const analysis = await diagnoser.analyse({
					observations: makeRandomFacts(diagnoser.rulebook, rng, 0.3)
				});
				const probability = new Map(analysis.causes.map((cause) => [cause.key, cause.probability]));
				const scores = analysis.tests.map(
					(test) =>
						test.targets.reduce((sum, key) => sum + (probability.get(key) as number), 0) /
						test.minutes
				);
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

	it('puts a slower test first when its suspects are more probable per minute', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const quiet = await diagnoser.analyse({ observations: {} });
		// No evidence: the 10-minute cap test (0.06 / 10) beats the 25-minute gas test (0.05 / 25).
		const order = quiet.tests.map((test) => test.key);
		expect(order.indexOf('cap_check')).toBeLessThan(order.indexOf('combustion_gas_check'));
		const suspicious = await diagnoser.analyse({
			observations: {
				exhaust_smoke: 'white_persistent',
				level_drops_between_checks: true,
				puddle_under_vehicle: false
			}
		});
		const gasket = suspicious.causes.find((cause) => cause.key === 'head_gasket_breach')
			?.probability as number;
		// Hand-worked: odds 0.05/0.95 × 6 × 4 = 1.263; p = 0.558; 0.558 / 25 min = 0.0223 per minute.
		expect(gasket).toBeCloseTo(1.2631578947 / 2.2631578947, 8);
		expect(suspicious.tests[0].key).toBe('pressure_test_system');
		const reordered = suspicious.tests.map((test) => test.key);
		expect(reordered.indexOf('combustion_gas_check')).toBeLessThan(reordered.indexOf('cap_check'));
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
