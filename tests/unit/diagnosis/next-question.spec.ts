import { describe, expect, it } from 'vitest';
import {
	createDiagnoser,
	type Diagnoser,
	type DiagnoseInput,
	type FrequencyOverrides,
	type ObservationValue
} from '../../../src/lib/diagnosis';
import {
	binaryEntropyBits,
	entropyBitsOfLogOdds,
	listAnswerOptions
} from '../../../src/lib/diagnosis/next-question';
import { logistic } from '../../../src/lib/diagnosis/rank';
import {
	diagnose,
	createRng,
	makeBooleanObservation,
	makeCoolingRulebook,
	makeNumberObservation,
	makeRandomFacts,
	makeRandomRulebook
} from './factories';

function sumEntropyBits(probabilities: number[]): number {
	return probabilities.reduce((sum, probability) => sum + binaryEntropyBits(probability), 0);
}

/** The expected gain of asking `key`, recomputed by running the full diagnosis per answer. */
async function bruteForceGain(
	diagnoser: Diagnoser,
	input: DiagnoseInput,
	key: string,
	frequencies?: FrequencyOverrides
): Promise<number> {
	const now = await diagnoser.analyse(input);
	const entropyNow = sumEntropyBits(now.causes.map((cause) => cause.probability));
	const observation = diagnoser.rulebook.observations.find((obs) => obs.key === key);
	if (!observation) throw new Error(key);
	let expected = 0;
	for (const option of listAnswerOptions(observation, frequencies)) {
		const after = await diagnoser.analyse({
			...input,
			observations: { ...input.observations, [key]: option.value }
		});
		expected +=
			option.probability *
			(entropyNow - sumEntropyBits(after.causes.map((cause) => cause.probability)));
	}
	return expected;
}

describe('binaryEntropyBits', () => {
	it('is 1 bit at p = 0.5 and 0 at certainty', () => {
		expect(binaryEntropyBits(0.5)).toBe(1);
		expect(binaryEntropyBits(0)).toBe(0);
		expect(binaryEntropyBits(1)).toBe(0);
		// h(0.1) = −0.1·log2 0.1 − 0.9·log2 0.9 = 0.468996 (computed here).
		expect(binaryEntropyBits(0.1)).toBeCloseTo(0.468996, 6);
	});
});

describe('entropyBitsOfLogOdds', () => {
	it('equals h(σ(x)) from log-odds, far into both tails', () => {
		for (let x = -40; x <= 40; x += 0.37) {
			expect(entropyBitsOfLogOdds(x)).toBeCloseTo(binaryEntropyBits(logistic(x)), 12);
		}
		expect(entropyBitsOfLogOdds(0)).toBe(1);
		expect(entropyBitsOfLogOdds(800)).toBe(0);
		expect(entropyBitsOfLogOdds(-800)).toBe(0);
	});
});

describe('listAnswerOptions', () => {
	it('takes boolean and enum frequencies, and number bins, normalised to sum to 1', () => {
		const boolean = listAnswerOptions(
			makeBooleanObservation({ frequencies: { true: 0.705, false: 0.3 } })
		);
		expect(boolean.map((option) => option.value)).toEqual([true, false]);
		expect(boolean[0].probability + boolean[1].probability).toBeCloseTo(1, 15);
		expect(boolean[0].probability).toBeCloseTo(0.705 / 1.005, 15);
		expect(listAnswerOptions(makeNumberObservation())).toEqual([
			{ value: 0, probability: 0.4 },
			{ value: 0.5, probability: 0.35 },
			{ value: 2, probability: 0.25 }
		]);
	});

	it('lets a shop override replace the rulebook frequencies, missing values counting 0', () => {
		const options = listAnswerOptions(makeBooleanObservation(), {
			fan_runs_when_hot: { false: 2 }
		});
		expect(options).toEqual([
			{ value: true, probability: 0 },
			{ value: false, probability: 1 }
		]);
		const bins = listAnswerOptions(makeNumberObservation(), {
			loss_l_per_week: { '0': 1, '2': 3 }
		});
		expect(bins.map((option) => option.probability)).toEqual([0.25, 0, 0.75]);
	});
});

describe('next questions', () => {
	it('lists every observation neither answered nor unknown, test results included', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const diagnosis = await diagnose(diagnoser, {
			observations: { temp_gauge: 'high_at_idle', cap_test: null },
			unknown: ['fan_circuit_test']
		});
		const keys = diagnosis.nextQuestions.map((question) => question.key).sort();
		const expected = diagnoser.rulebook.observations
			.map((obs) => obs.key)
			.filter((key) => key !== 'temp_gauge' && key !== 'fan_circuit_test')
			.sort();
		expect(keys).toEqual(expected);
		expect(keys).toContain('cap_test');
		expect(keys).toContain('pressure_test');
	});

	it('leaves out observations answered through the complaint', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const diagnosis = await diagnose(diagnoser, { observations: {}, complaint: 'windows fog up' });
		expect(diagnosis.nextQuestions.map((question) => question.key)).not.toContain(
			'windscreen_film'
		);
	});

	it('orders by expected gain, highest first, then by key, with gains rounded to 4 decimals', async () => {
		const diagnoser = createDiagnoser(makeRandomRulebook(51));
		const rng = createRng(51);
		for (let run = 0; run < 20; run++) {
			const { nextQuestions } = await diagnose(diagnoser, {
				observations: makeRandomFacts(diagnoser.rulebook, rng, 0.3)
			});
			for (let index = 1; index < nextQuestions.length; index++) {
				const [a, b] = [nextQuestions[index - 1], nextQuestions[index]];
				expect(
					a.expectedGain > b.expectedGain || (a.expectedGain === b.expectedGain && a.key < b.key)
				).toBe(true);
			}
			for (const question of nextQuestions) {
				expect(Math.round(question.expectedGain * 1e4) / 1e4).toBe(question.expectedGain);
			}
		}
	});

	it('carries kind, group and choices for the interface', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const { nextQuestions } = await diagnose(diagnoser, { observations: {} });
		const gauge = nextQuestions.find((question) => question.key === 'temp_gauge');
		expect(gauge).toMatchObject({
			kind: 'enum',
			group: 'symptom',
			values: ['normal', 'high_at_idle', 'high_at_speed', 'high_always'],
			prompt: 'How does the temperature gauge behave while driving?'
		});
		const loss = nextQuestions.find((question) => question.key === 'loss_l_per_week');
		expect(loss).toMatchObject({ kind: 'number', unit: 'L/week', min: 0, max: 50 });
		expect(loss?.bins).toHaveLength(3);
		const level = nextQuestions.find((question) => question.key === 'coolant_level');
		expect(level?.cautions).toEqual(['Check the level only with the engine cold.']);
	});

	it('describes only the best few when asked, in the same order', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const input = { observations: { coolant_level: 'low' } } as const;
		const all = (await diagnose(diagnoser, input)).nextQuestions;
		expect(all.length).toBeGreaterThan(3);
		const best = (await diagnose(diagnoser, input, { questionLimit: 3 })).nextQuestions;
		expect(best).toEqual(all.slice(0, 3));
	});

	it('gives gain 0 to a question whose answers cannot change any cause', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const gainOf = async (input: DiagnoseInput, key: string) =>
			(await diagnoser.analyse(input)).nextQuestions.find((question) => question.key === key)
				?.expectedGain;
		// No rule mentions the wiper blades.
		expect(await gainOf({ observations: {} }, 'wiper_blades_worn')).toBe(0);
		// The only heater rule also needs a recent refill, which is unanswered, then answered "no".
		expect(await gainOf({ observations: {} }, 'heater_output')).toBe(0);
		expect(await gainOf({ observations: { recent_coolant_service: false } }, 'heater_output')).toBe(
			0
		);
		// The film only matters inside a rule the cabin smell already fires.
		expect(await gainOf({ observations: { sweet_smell: 'cabin' } }, 'windscreen_film')).toBe(0);
		// Control: once a refill is known, the heater question does move a cause.
		expect(
			await gainOf({ observations: { recent_coolant_service: true } }, 'heater_output')
		).not.toBe(0);
	});

	it('equals a brute-force recomputation (full diagnosis per answer) within 1e-9', async () => {
		let compared = 0;
		let nonZero = 0;
		for (const seed of [61, 62]) {
			const diagnoser = createDiagnoser(
				makeRandomRulebook(seed, { causes: 8, observations: 15, rules: 40, tests: 3 })
			);
			const rng = createRng(seed);
			for (let run = 0; run < 8; run++) {
				const input = {
					observations: makeRandomFacts(diagnoser.rulebook, rng, 0.35),
					unknown: [diagnoser.rulebook.observations[run % 15].key]
				};
				const { nextQuestions } = await diagnoser.analyse(input);
				for (const question of nextQuestions) {
					const expected = await bruteForceGain(diagnoser, input, question.key);
					expect(Math.abs(question.expectedGain - expected), question.key).toBeLessThan(1e-9);
					compared++;
					if (Math.abs(expected) > 1e-6) nonZero++;
				}
			}
		}
		expect(compared).toBeGreaterThan(100);
		expect(nonZero).toBeGreaterThan(30);
	});

	it('equals the brute force under shop frequency overrides too, and the overrides change it', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const input: DiagnoseInput = { observations: { temp_gauge: 'high_at_idle' } };
		const frequencies: FrequencyOverrides = {
			fan_runs_when_hot: { true: 0.2, false: 0.8 },
			cap_test: { holds_rating: 0.5, fails: 0.5 }
		};
		const plain = await diagnoser.analyse(input);
		const overridden = await diagnoser.analyse(input, { frequencies });
		for (const key of ['fan_runs_when_hot', 'cap_test']) {
			const gain = overridden.nextQuestions.find((question) => question.key === key)
				?.expectedGain as number;
			expect(
				Math.abs(gain - (await bruteForceGain(diagnoser, input, key, frequencies)))
			).toBeLessThan(1e-9);
			expect(gain).not.toBeCloseTo(
				plain.nextQuestions.find((question) => question.key === key)?.expectedGain as number,
				4
			);
		}
		// The same overrides given when building the diagnoser act as its default.
		const shopDiagnoser = createDiagnoser(makeCoolingRulebook(), { frequencies });
		expect((await shopDiagnoser.analyse(input)).nextQuestions).toEqual(overridden.nextQuestions);
	});

	it('handles number observations through their bins', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const input: DiagnoseInput = {
			observations: { puddle_under_vehicle: false as ObservationValue }
		};
		const { nextQuestions } = await diagnoser.analyse(input);
		const loss = nextQuestions.find((question) => question.key === 'loss_l_per_week');
		// The cap rule needs ≥ 0.5 L/week with no drips: two of the three bins fire it.
		expect(loss?.expectedGain).not.toBe(0);
		expect(
			Math.abs(
				(loss?.expectedGain as number) - (await bruteForceGain(diagnoser, input, 'loss_l_per_week'))
			)
		).toBeLessThan(1e-9);
	});
});
