import { describe, expect, it } from 'vitest';
import { createDiagnoser, type ObservationValue } from '../../../src/lib/diagnosis';
import { assignBand, logistic } from '../../../src/lib/diagnosis/rank';
import {
	diagnose,
	COOLING_FIXTURE_NORMAL_ANSWERS,
	createRng,
	makeCause,
	makeCoolingRulebook,
	makeRandomFacts,
	makeRandomRulebook,
	makeRule,
	makeRulebook
} from './factories';

describe('ranking with no evidence', () => {
	it('gives exactly the priors, in prior order', async () => {
		const rulebook = makeCoolingRulebook();
		const diagnoser = createDiagnoser(rulebook);
		const analysis = await diagnoser.analyse({ observations: {} });
		for (const cause of rulebook.causes) {
			const ranked = analysis.causes.find((entry) => entry.key === cause.key);
			expect(ranked?.probability).toBeCloseTo(cause.prior, 12);
			expect(ranked?.evidence).toEqual([]);
		}
		const diagnosis = await diagnose(diagnoser, { observations: {} });
		expect(diagnosis.causes.map((cause) => cause.probability)).toEqual(
			[...rulebook.causes].map((cause) => cause.prior).sort((a, b) => b - a)
		);
		expect(diagnosis.causes.every((cause) => cause.band !== 'likely')).toBe(true);
	});

	it('gives the priors on random rulebooks too, null answers and unknowns included', async () => {
		for (const seed of [31, 32]) {
			const rulebook = makeRandomRulebook(seed);
			const diagnoser = createDiagnoser(rulebook);
			const observations = Object.fromEntries(rulebook.observations.map((obs) => [obs.key, null]));
			const analysis = await diagnoser.analyse({
				observations,
				unknown: [rulebook.observations[0].key]
			});
			const priors = new Map(rulebook.causes.map((cause) => [cause.key, cause.prior]));
			for (const cause of analysis.causes)
				expect(cause.probability).toBeCloseTo(priors.get(cause.key) as number, 12);
		}
	});
});

describe('ranking with all-normal answers', () => {
	it('calls no cause likely when every answer is the healthy one', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const diagnosis = await diagnose(diagnoser, { observations: COOLING_FIXTURE_NORMAL_ANSWERS });
		expect(diagnosis.causes.filter((cause) => cause.band === 'likely')).toEqual([]);
		// And the healthy answers argue against causes rather than for them.
		for (const cause of diagnosis.causes) {
			const prior = diagnoser.rulebook.causes.find((entry) => entry.key === cause.key)
				?.prior as number;
			expect(cause.probability).toBeLessThanOrEqual(prior);
		}
	});
});

describe('posterior arithmetic', () => {
	it('multiplies prior odds by the lr of every fired rule of the cause', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const analysis = await diagnoser.analyse({
			observations: { fan_runs_when_hot: false, temp_gauge: 'high_at_idle' }
		});
		const fan = analysis.causes.find((cause) => cause.key === 'cooling_fan_fault');
		// Hand-worked: odds 0.08 / 0.92 × 9 × 3 = 2.347826…; p = odds / (1 + odds) = 0.701299…
		const odds = (0.08 / 0.92) * 9 * 3;
		expect(fan?.probability).toBeCloseTo(odds / (1 + odds), 12);
		expect(fan?.probability).toBeCloseTo(0.7013, 4);
		expect(fan?.band).toBe('likely');
		expect(fan?.evidence.map((item) => item.rule)).toEqual(['fan-off-when-hot', 'hot-at-idle']);
	});

	it('lists evidence by weight |ln lr|, so a strong argument against comes before a weak one for', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const analysis = await diagnoser.analyse({
			observations: { temp_gauge: 'high_at_idle', fan_circuit_test: 'ok' }
		});
		const fan = analysis.causes.find((cause) => cause.key === 'cooling_fan_fault');
		// lr 0.1 (|ln| = 2.30) outweighs lr 3 (|ln| = 1.10).
		expect(fan?.evidence).toEqual([
			{
				rule: 'fan-circuit-ok',
				lr: 0.1,
				because: 'Fixture rule fan-circuit-ok.',
				source: 'common practice, no source'
			},
			{
				rule: 'hot-at-idle',
				lr: 3,
				because: 'Fixture rule hot-at-idle.',
				source: 'common practice, no source'
			}
		]);
	});

	it('breaks probability ties by cause key', async () => {
		const rulebook = makeRulebook({
			causes: [
				makeCause({ key: 'zeta_fault', prior: 0.1 }),
				makeCause({ key: 'alpha_fault', prior: 0.1 }),
				makeCause({ key: 'mid_fault', prior: 0.1 })
			],
			rules: [
				...['zeta_fault', 'alpha_fault', 'mid_fault'].map((cause) =>
					makeRule({ key: `${cause.replace('_', '-')}-rule`, cause, lr: 2 })
				),
				makeRule({
					key: 'circuit-fault',
					cause: 'mid_fault',
					lr: 3,
					conditions: {
						all: [{ fact: 'fan_circuit_test', operator: 'equal', value: 'fault_found' }]
					}
				})
			]
		});
		const diagnosis = await diagnose(createDiagnoser(rulebook), { observations: {} });
		expect(diagnosis.causes.map((cause) => cause.key)).toEqual([
			'alpha_fault',
			'mid_fault',
			'zeta_fault'
		]);
	});

	it('assigns bands at the rulebook thresholds, inclusive', () => {
		const bands = { likely: 0.5, possible: 0.15 };
		expect(assignBand(0.5, bands)).toBe('likely');
		expect(assignBand(0.4999, bands)).toBe('possible');
		expect(assignBand(0.15, bands)).toBe('possible');
		expect(assignBand(0.1499, bands)).toBe('unlikely');
	});

	it('keeps the logistic finite at extreme log-odds', () => {
		expect(logistic(800)).toBe(1);
		expect(logistic(-800)).toBe(0);
		expect(logistic(0)).toBe(0.5);
	});
});

describe('monotonicity', () => {
	it('never lowers a cause on a supporting answer nor raises it on an arguing-against one', async () => {
		let supportingChecks = 0;
		let againstChecks = 0;
		for (const seed of [41, 42, 43]) {
			const rulebook = makeRandomRulebook(seed);
			const diagnoser = createDiagnoser(rulebook);
			const rulesByKey = new Map(rulebook.rules.map((rule) => [rule.key, rule]));
			const rng = createRng(seed);
			for (let run = 0; run < 120; run++) {
				const facts = makeRandomFacts(rulebook, rng, 0.4);
				const unanswered = rulebook.observations.filter((obs) => facts[obs.key] == null);
				if (unanswered.length === 0) continue;
				const observation = unanswered[Math.floor(rng() * unanswered.length)];
				const extra = makeRandomFacts({ ...rulebook, observations: [observation] }, rng, 1);
				const before = await diagnoser.analyse({ observations: facts });
				const after = await diagnoser.analyse({ observations: { ...facts, ...extra } });
				// An answer only ever adds fired rules.
				expect(after.firedRules).toEqual(expect.arrayContaining(before.firedRules));
				const added = after.firedRules.filter((key) => !before.firedRules.includes(key));
				for (const cause of after.causes) {
					const previous = before.causes.find((entry) => entry.key === cause.key)
						?.probability as number;
					const lrs = added
						.map((key) => rulesByKey.get(key))
						.filter((rule) => rule?.cause === cause.key)
						.map((rule) => rule?.lr as number);
					if (lrs.length === 0) expect(cause.probability).toBe(previous);
					else if (lrs.every((lr) => lr > 1)) {
						expect(cause.probability).toBeGreaterThan(previous);
						supportingChecks++;
					} else if (lrs.every((lr) => lr < 1)) {
						expect(cause.probability).toBeLessThan(previous);
						againstChecks++;
					}
				}
			}
		}
		expect(supportingChecks).toBeGreaterThan(50);
		expect(againstChecks).toBeGreaterThan(20);
	});

	it('raises the fan cause on each supporting answer of the fixture, one after another', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const steps: Record<string, ObservationValue>[] = [
			{ temp_gauge: 'high_at_idle' },
			{ fan_runs_when_hot: false },
			{ fan_circuit_test: 'fault_found' }
		];
		let observations: Record<string, ObservationValue> = {};
		let previous = 0.08;
		for (const step of steps) {
			observations = { ...observations, ...step };
			const analysis = await diagnoser.analyse({ observations });
			const fan = analysis.causes.find((cause) => cause.key === 'cooling_fan_fault')
				?.probability as number;
			expect(fan).toBeGreaterThan(previous);
			previous = fan;
		}
	});
});

describe('determinism', () => {
	it('gives the same output whatever the key order of observations and unknown, and the request order', async () => {
		const rulebook = makeCoolingRulebook();
		const diagnoser = createDiagnoser(rulebook);
		const rng = createRng(77);
		const inputs = Array.from({ length: 30 }, () => ({
			observations: makeRandomFacts(rulebook, rng, 0.5),
			unknown: ['cap_test', 'wiper_blades_worn'],
			complaint: 'losing water but no leaks on the drive'
		}));
		const forward = [];
		for (const input of inputs) forward.push(await diagnose(diagnoser, input));
		const shuffled = inputs.map((input) => ({
			observations: Object.fromEntries(Object.entries(input.observations).reverse()),
			unknown: [...input.unknown].reverse(),
			complaint: input.complaint
		}));
		const backward = [];
		for (const input of [...shuffled].reverse()) backward.push(await diagnose(diagnoser, input));
		expect(backward.reverse()).toEqual(forward);
		expect(JSON.stringify(backward)).toBe(JSON.stringify(forward));
	});
});
