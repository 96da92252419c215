// Fixture rulebooks for the engine's tests. Everything here is invented for the tests: the
// weights and frequencies are not trade data and must not be read as such.
import {
	compileRulebook,
	evaluateCompiled,
	listFiredRuleKeys,
	toFactVector
} from '../../../src/lib/diagnosis/evaluate';
import { shapeDiagnosis, type ShapeOptions } from '../../../src/lib/api/diagnosis-response';
import type { AnalyseOptions, DiagnoseInput, Diagnoser } from '../../../src/lib/diagnosis';
import type {
	BooleanObservation,
	Cause,
	Condition,
	ConfirmingTest,
	EnumObservation,
	NumberObservation,
	ObservationValue,
	Rule,
	Rulebook,
	RulebookMeta,
	TopLevelCondition
} from '../../../src/lib/diagnosis/schema';

export function makeMeta(overrides: Partial<RulebookMeta> = {}): RulebookMeta {
	return {
		name: 'Test rulebook',
		schemaVersion: 1,
		bands: { likely: 0.5, possible: 0.15 },
		cautions: ['Let the engine cool before opening the cooling system.'],
		...overrides
	};
}

export function makeCause(overrides: Partial<Cause> = {}): Cause {
	return {
		key: 'cooling_fan_fault',
		name: 'Cooling fan not running',
		prior: 0.08,
		description: 'The fan does not pull air through the radiator.',
		usualFix: 'Repair the fan circuit or replace the fan motor.',
		cautions: [],
		...overrides
	};
}

export function makeBooleanObservation(
	overrides: Partial<BooleanObservation> = {}
): BooleanObservation {
	return {
		key: 'fan_runs_when_hot',
		kind: 'boolean',
		prompt: 'Does the cooling fan run when the engine is hot?',
		group: 'inspection',
		cautions: [],
		frequencies: { true: 0.7, false: 0.3 },
		phrases: [],
		...overrides
	};
}

export function makeEnumObservation(overrides: Partial<EnumObservation> = {}): EnumObservation {
	return {
		key: 'temp_gauge',
		kind: 'enum',
		values: ['normal', 'high_at_idle', 'high_at_speed'],
		prompt: 'How does the temperature gauge behave while driving?',
		group: 'symptom',
		cautions: [],
		frequencies: { normal: 0.4, high_at_idle: 0.35, high_at_speed: 0.25 },
		phrases: [],
		...overrides
	};
}

export function makeNumberObservation(
	overrides: Partial<NumberObservation> = {}
): NumberObservation {
	return {
		key: 'loss_l_per_week',
		kind: 'number',
		unit: 'L/week',
		min: 0,
		max: 50,
		prompt: 'How much coolant is topped up per week?',
		group: 'vehicle_history',
		cautions: [],
		bins: [
			{ value: 0, label: 'None', frequency: 0.4 },
			{ value: 0.5, label: 'Under 1 L', frequency: 0.35 },
			{ value: 2, label: '1 L or more', frequency: 0.25 }
		],
		phrases: [],
		...overrides
	};
}

export function makeRule(overrides: Partial<Rule> = {}): Rule {
	return {
		key: 'fan-off-when-hot',
		cause: 'cooling_fan_fault',
		lr: 9,
		conditions: { all: [{ fact: 'fan_runs_when_hot', operator: 'equal', value: false }] },
		rationale: 'A fan that stays off with the engine hot cannot move air at idle.',
		source: 'common practice, no source',
		...overrides
	};
}

export function makeTest(overrides: Partial<ConfirmingTest> = {}): ConfirmingTest {
	return {
		key: 'fan_circuit_check',
		name: 'Fan circuit check',
		minutes: 15,
		equipment: ['Multimeter'],
		steps: ['Check the fan fuse and relay.', 'Power the fan motor directly.'],
		cautions: ['Keep hands and sleeves clear of the fan.'],
		sets: 'fan_circuit_test',
		...overrides
	};
}

/** A small valid rulebook: two causes, four observations, five rules, one test. */
export function makeRulebook(overrides: Partial<Rulebook> = {}): Rulebook {
	return {
		meta: makeMeta(),
		causes: [
			makeCause(),
			makeCause({ key: 'thermostat_stuck_closed', name: 'Thermostat stuck closed', prior: 0.07 })
		],
		observations: [
			makeBooleanObservation(),
			makeEnumObservation(),
			makeNumberObservation(),
			makeEnumObservation({
				key: 'fan_circuit_test',
				values: ['ok', 'fault_found'],
				prompt: 'Result of the fan circuit check',
				group: 'test_result',
				frequencies: { ok: 0.7, fault_found: 0.3 }
			})
		],
		rules: [
			makeRule(),
			makeRule({
				key: 'fan-runs-when-hot',
				lr: 0.2,
				conditions: { all: [{ fact: 'fan_runs_when_hot', operator: 'equal', value: true }] }
			}),
			makeRule({
				key: 'fan-circuit-fault',
				lr: 20,
				conditions: { all: [{ fact: 'fan_circuit_test', operator: 'equal', value: 'fault_found' }] }
			}),
			makeRule({
				key: 'hot-at-speed-not-idle',
				cause: 'thermostat_stuck_closed',
				lr: 3,
				conditions: { all: [{ fact: 'temp_gauge', operator: 'equal', value: 'high_at_speed' }] }
			}),
			makeRule({
				key: 'gauge-normal',
				cause: 'thermostat_stuck_closed',
				lr: 0.3,
				conditions: { all: [{ fact: 'temp_gauge', operator: 'equal', value: 'normal' }] }
			})
		],
		tests: [makeTest()],
		...overrides
	};
}

function leaf(fact: string, operator: string, value: ObservationValue | ObservationValue[]) {
	return { fact, operator, value } as Condition;
}

/**
 * An invented cooling-system rulebook, big enough for behaviour tests: eight causes, fourteen
 * observations (with customer phrases), twenty-odd rules, five tests.
 */
export function makeCoolingRulebook(): Rulebook {
	const causes: Cause[] = [
		makeCause({ key: 'cooling_fan_fault', name: 'Cooling fan not running', prior: 0.08 }),
		makeCause({ key: 'thermostat_stuck_closed', name: 'Thermostat stuck closed', prior: 0.07 }),
		makeCause({ key: 'trapped_air', name: 'Air trapped after a refill', prior: 0.1 }),
		makeCause({
			key: 'head_gasket_breach',
			name: 'Head gasket leaking into the cooling system',
			prior: 0.05,
			cautions: ['Do not keep driving an engine that is pushing coolant out.']
		}),
		makeCause({ key: 'heater_core_leak', name: 'Heater core leaking into the cabin', prior: 0.04 }),
		makeCause({ key: 'hose_or_clamp_leak', name: 'Leaking hose or clamp', prior: 0.12 }),
		makeCause({ key: 'pressure_cap_fault', name: 'Pressure cap not holding', prior: 0.06 }),
		makeCause({ key: 'radiator_restricted', name: 'Radiator restricted', prior: 0.06 })
	];
	const observations = [
		makeBooleanObservation({
			key: 'recent_coolant_service',
			prompt: 'Was the cooling system drained or refilled in the last two weeks?',
			group: 'vehicle_history',
			frequencies: { true: 0.2, false: 0.8 },
			phrases: [{ text: 'just had the coolant changed', value: true }]
		}),
		makeEnumObservation({
			key: 'temp_gauge',
			values: ['normal', 'high_at_idle', 'high_at_speed', 'high_always'],
			frequencies: { normal: 0.3, high_at_idle: 0.3, high_at_speed: 0.2, high_always: 0.2 },
			phrases: [
				{ text: 'hot in traffic', value: 'high_at_idle' },
				{ text: 'overheats when idling', value: 'high_at_idle' },
				{ text: 'overheats on the motorway', value: 'high_at_speed' },
				{ text: 'runs hot all the time', value: 'high_always' }
			]
		}),
		makeEnumObservation({
			key: 'coolant_level',
			values: ['full', 'low', 'empty'],
			prompt: 'Coolant level with the engine cold?',
			group: 'inspection',
			cautions: ['Check the level only with the engine cold.'],
			frequencies: { full: 0.5, low: 0.4, empty: 0.1 },
			phrases: [{ text: 'coolant is low', value: 'low' }]
		}),
		makeBooleanObservation({
			key: 'level_drops_between_checks',
			prompt: 'Does the cold level keep falling between checks?',
			group: 'symptom',
			frequencies: { true: 0.4, false: 0.6 },
			phrases: [
				{ text: 'losing water', value: true },
				{ text: 'keeps losing coolant', value: true },
				{ text: 'level keeps dropping', value: true }
			]
		}),
		makeBooleanObservation({
			key: 'puddle_under_vehicle',
			prompt: 'Does coolant drip or puddle under the parked vehicle?',
			group: 'symptom',
			frequencies: { true: 0.3, false: 0.7 },
			phrases: [
				{ text: 'leaks on the drive', value: true },
				{ text: 'puddle under the car', value: true },
				{ text: 'coolant dripping on the ground', value: true },
				{ text: 'no drips', value: false }
			]
		}),
		makeEnumObservation({
			key: 'sweet_smell',
			values: ['none', 'engine_bay', 'cabin'],
			prompt: 'Is there a sweet smell, and where?',
			frequencies: { none: 0.7, engine_bay: 0.2, cabin: 0.1 },
			phrases: [
				{ text: 'sweet smell inside', value: 'cabin' },
				{ text: 'smells sweet under the bonnet', value: 'engine_bay' }
			]
		}),
		makeBooleanObservation({
			key: 'windscreen_film',
			prompt: 'Does a greasy fog form inside the windscreen with the heater on?',
			group: 'symptom',
			frequencies: { true: 0.15, false: 0.85 },
			phrases: [
				{ text: 'windows fog up', value: true },
				{ text: 'greasy film on the windscreen', value: true }
			]
		}),
		makeEnumObservation({
			key: 'exhaust_smoke',
			values: ['none', 'white_at_cold_start_only', 'white_persistent'],
			prompt: 'Is there white smoke from the exhaust?',
			frequencies: { none: 0.7, white_at_cold_start_only: 0.2, white_persistent: 0.1 },
			phrases: [
				{ text: 'white smoke out the back', value: 'white_persistent' },
				{ text: 'white smoke all the time', value: 'white_persistent' },
				{ text: 'steam from the exhaust on cold mornings', value: 'white_at_cold_start_only' }
			]
		}),
		makeBooleanObservation({
			key: 'fan_runs_when_hot',
			frequencies: { true: 0.75, false: 0.25 },
			cautions: ['Keep hands and sleeves clear of the fan and belts.'],
			phrases: [
				{ text: 'fan never comes on', value: false },
				{ text: 'fan kicks in', value: true }
			]
		}),
		makeEnumObservation({
			key: 'heater_output',
			values: ['normal', 'cold'],
			prompt: 'Heater output with the engine warm?',
			frequencies: { normal: 0.7, cold: 0.3 },
			phrases: [
				{ text: 'heater blows cold', value: 'cold' },
				{ text: 'no heat', value: 'cold' }
			]
		}),
		makeNumberObservation({
			key: 'loss_l_per_week',
			phrases: [{ text: 'a litre a week', value: 1 }]
		}),
		makeEnumObservation({
			key: 'pressure_test',
			values: ['holds', 'drops_external_leak_found', 'drops_no_visible_leak'],
			prompt: 'Result of the cooling system pressure test',
			group: 'test_result',
			frequencies: { holds: 0.5, drops_external_leak_found: 0.3, drops_no_visible_leak: 0.2 }
		}),
		makeEnumObservation({
			key: 'combustion_gas_test',
			values: ['negative', 'positive'],
			prompt: 'Result of the combustion gas test',
			group: 'test_result',
			frequencies: { negative: 0.8, positive: 0.2 }
		}),
		makeEnumObservation({
			key: 'cap_test',
			values: ['holds_rating', 'fails'],
			prompt: 'Result of the cap test',
			group: 'test_result',
			frequencies: { holds_rating: 0.8, fails: 0.2 }
		}),
		makeEnumObservation({
			key: 'fan_circuit_test',
			values: ['ok', 'fault_found'],
			prompt: 'Result of the fan circuit check',
			group: 'test_result',
			frequencies: { ok: 0.7, fault_found: 0.3 }
		}),
		makeBooleanObservation({
			key: 'wiper_blades_worn',
			prompt: 'Are the wiper blades worn?',
			group: 'inspection',
			frequencies: { true: 0.5, false: 0.5 }
		})
	];
	const rule = (key: string, cause: string, lr: number, conditions: TopLevelCondition): Rule =>
		makeRule({ key, cause, lr, conditions, rationale: `Fixture rule ${key}.` });
	const rules: Rule[] = [
		rule('fan-off-when-hot', 'cooling_fan_fault', 9, {
			all: [leaf('fan_runs_when_hot', 'equal', false)]
		}),
		rule('fan-runs-when-hot', 'cooling_fan_fault', 0.15, {
			all: [leaf('fan_runs_when_hot', 'equal', true)]
		}),
		rule('hot-at-idle', 'cooling_fan_fault', 3, {
			all: [leaf('temp_gauge', 'equal', 'high_at_idle')]
		}),
		rule('fan-circuit-fault', 'cooling_fan_fault', 25, {
			all: [leaf('fan_circuit_test', 'equal', 'fault_found')]
		}),
		rule('fan-circuit-ok', 'cooling_fan_fault', 0.1, {
			all: [leaf('fan_circuit_test', 'equal', 'ok')]
		}),
		rule('hot-always-or-at-speed', 'thermostat_stuck_closed', 3, {
			any: [leaf('temp_gauge', 'in', ['high_always', 'high_at_speed'])]
		}),
		rule('gauge-normal-thermostat', 'thermostat_stuck_closed', 0.3, {
			all: [leaf('temp_gauge', 'equal', 'normal')]
		}),
		rule('refill-then-cold-heater', 'trapped_air', 8, {
			all: [leaf('recent_coolant_service', 'equal', true), leaf('heater_output', 'equal', 'cold')]
		}),
		rule('recent-refill', 'trapped_air', 3, {
			all: [leaf('recent_coolant_service', 'equal', true)]
		}),
		rule('no-recent-refill', 'trapped_air', 0.3, {
			all: [leaf('recent_coolant_service', 'equal', false)]
		}),
		rule('internal-loss-signs', 'head_gasket_breach', 6, {
			all: [
				leaf('level_drops_between_checks', 'equal', true),
				leaf('puddle_under_vehicle', 'equal', false)
			]
		}),
		rule('white-smoke-persistent', 'head_gasket_breach', 4, {
			all: [leaf('exhaust_smoke', 'equal', 'white_persistent')]
		}),
		rule('combustion-gas-positive', 'head_gasket_breach', 30, {
			all: [leaf('combustion_gas_test', 'equal', 'positive')]
		}),
		rule('combustion-gas-negative', 'head_gasket_breach', 0.1, {
			all: [leaf('combustion_gas_test', 'equal', 'negative')]
		}),
		rule('pressure-drop-hidden', 'head_gasket_breach', 3, {
			all: [leaf('pressure_test', 'equal', 'drops_no_visible_leak')]
		}),
		rule('cabin-smell-and-film', 'heater_core_leak', 12, {
			any: [
				{ all: [leaf('sweet_smell', 'equal', 'cabin'), leaf('windscreen_film', 'equal', true)] },
				leaf('sweet_smell', 'equal', 'cabin')
			]
		}),
		rule('no-cabin-smell', 'heater_core_leak', 0.3, {
			all: [leaf('sweet_smell', 'notEqual', 'cabin')]
		}),
		rule('drips-under-car', 'hose_or_clamp_leak', 5, {
			all: [leaf('puddle_under_vehicle', 'equal', true)]
		}),
		rule('external-leak-found', 'hose_or_clamp_leak', 10, {
			all: [leaf('pressure_test', 'equal', 'drops_external_leak_found')]
		}),
		rule('heavy-loss-no-drips', 'pressure_cap_fault', 2, {
			all: [
				leaf('loss_l_per_week', 'greaterThanInclusive', 0.5),
				leaf('puddle_under_vehicle', 'equal', false)
			]
		}),
		rule('cap-fails', 'pressure_cap_fault', 20, { all: [leaf('cap_test', 'equal', 'fails')] }),
		rule('cap-holds', 'pressure_cap_fault', 0.1, {
			all: [leaf('cap_test', 'equal', 'holds_rating')]
		}),
		rule('hot-at-speed-radiator', 'radiator_restricted', 4, {
			all: [
				leaf('temp_gauge', 'equal', 'high_at_speed'),
				leaf('fan_runs_when_hot', 'notEqual', false)
			]
		}),
		rule('gauge-normal-radiator', 'radiator_restricted', 0.3, {
			all: [leaf('temp_gauge', 'equal', 'normal')]
		})
	];
	const tests: ConfirmingTest[] = [
		makeTest({ key: 'fan_circuit_check', minutes: 15, sets: 'fan_circuit_test' }),
		makeTest({
			key: 'pressure_test_system',
			name: 'Cooling system pressure test',
			minutes: 20,
			equipment: ['Cooling system pressure tester'],
			steps: ['Let the engine cool.', 'Pressurise to the cap rating and watch the gauge.'],
			cautions: ['Never open the cap on a hot, pressurised system.'],
			sets: 'pressure_test'
		}),
		makeTest({
			key: 'combustion_gas_check',
			name: 'Combustion gas test',
			minutes: 25,
			equipment: ['Block tester with test fluid'],
			steps: ['Draw air from above the coolant through the test fluid.'],
			cautions: ['Run the engine only with exhaust extraction.'],
			sets: 'combustion_gas_test'
		}),
		makeTest({
			key: 'cap_check',
			name: 'Pressure cap test',
			minutes: 10,
			equipment: ['Cap adapter'],
			steps: ['Fit the cap to the adapter and pump to its rating.'],
			cautions: ['Remove the cap only from a cold system.'],
			sets: 'cap_test'
		})
	];
	return {
		meta: makeMeta({ name: 'Fixture cooling rulebook' }),
		causes,
		observations,
		rules,
		tests
	};
}

/** The answer a healthy cooling system gives to each of the cooling fixture's questions. */
export const COOLING_FIXTURE_NORMAL_ANSWERS: Record<string, ObservationValue> = {
	recent_coolant_service: false,
	temp_gauge: 'normal',
	coolant_level: 'full',
	level_drops_between_checks: false,
	puddle_under_vehicle: false,
	sweet_smell: 'none',
	windscreen_film: false,
	exhaust_smoke: 'none',
	fan_runs_when_hot: true,
	heater_output: 'normal',
	loss_l_per_week: 0,
	pressure_test: 'holds',
	combustion_gas_test: 'negative',
	cap_test: 'holds_rating',
	fan_circuit_test: 'ok',
	wiper_blades_worn: false
};

/** Deterministic pseudo-random numbers (mulberry32) so property tests are reproducible. */
export function createRng(seed: number): () => number {
	let state = seed >>> 0;
	return () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

function pick<T>(rng: () => number, items: readonly T[]): T {
	return items[Math.floor(rng() * items.length)];
}

function makeFrequencies(rng: () => number, keys: string[]): Record<string, number> {
	const raw = keys.map(() => 0.2 + rng());
	const total = raw.reduce((sum, value) => sum + value, 0);
	return Object.fromEntries(keys.map((key, index) => [key, raw[index] / total]));
}

export interface RandomRulebookSizes {
	causes: number;
	observations: number;
	rules: number;
	tests: number;
}

/**
 * A random but valid rulebook: every kind of observation, every operator, nested all/any up to
 * three levels, negative operators throughout. For property tests and benchmarks.
 */
export function makeRandomRulebook(
	seed: number,
	sizes: RandomRulebookSizes = { causes: 19, observations: 35, rules: 100, tests: 8 }
): Rulebook {
	const rng = createRng(seed);
	const causes = Array.from({ length: sizes.causes }, (_, index) =>
		makeCause({ key: `cause_${index}`, name: `Cause ${index}`, prior: 0.02 + rng() * 0.2 })
	);
	const observations: Rulebook['observations'] = Array.from(
		{ length: sizes.observations },
		(_, index) => {
			const kind = index % 3;
			const key = `obs_${index}`;
			if (kind === 0) {
				return makeBooleanObservation({
					key,
					group: 'symptom',
					frequencies: makeFrequencies(rng, ['true', 'false'])
				});
			}
			if (kind === 1) {
				const values = Array.from({ length: 2 + Math.floor(rng() * 4) }, (_, v) => `v${v}`);
				return makeEnumObservation({
					key,
					values,
					group: 'inspection',
					frequencies: makeFrequencies(rng, values)
				});
			}
			const binValues = [0, 5, 10, 20];
			const frequencies = makeFrequencies(rng, binValues.map(String));
			return makeNumberObservation({
				key,
				min: 0,
				max: 20,
				group: 'vehicle_history',
				bins: binValues.map((value) => ({
					value,
					label: `${value}`,
					frequency: frequencies[String(value)]
				}))
			});
		}
	);
	const testCount = Math.min(sizes.tests, observations.length);
	for (let index = 0; index < testCount; index++) observations[index].group = 'test_result';

	const makeLeaf = (): Condition => {
		const observation = pick(rng, observations);
		if (observation.kind === 'boolean') {
			const operator = pick(rng, ['equal', 'notEqual', 'in', 'notIn'] as const);
			const value = rng() < 0.5;
			return leaf(observation.key, operator, operator.endsWith('n') ? [value] : value);
		}
		if (observation.kind === 'enum') {
			const operator = pick(rng, ['equal', 'notEqual', 'in', 'notIn'] as const);
			if (operator === 'in' || operator === 'notIn') {
				const chosen = observation.values.filter(() => rng() < 0.5);
				return leaf(observation.key, operator, chosen.length ? chosen : [observation.values[0]]);
			}
			return leaf(observation.key, operator, pick(rng, observation.values));
		}
		const operator = pick(rng, [
			'equal',
			'notEqual',
			'lessThan',
			'lessThanInclusive',
			'greaterThan',
			'greaterThanInclusive',
			'in',
			'notIn'
		] as const);
		const value = pick(rng, [0, 5, 10, 20, 7.5]);
		return leaf(
			observation.key,
			operator,
			operator === 'in' || operator === 'notIn' ? [value, 10] : value
		);
	};
	const makeGroup = (depth: number): TopLevelCondition => {
		const size = 1 + Math.floor(rng() * 3);
		const members = Array.from({ length: size }, () =>
			depth < 3 && rng() < 0.3 ? makeGroup(depth + 1) : makeLeaf()
		);
		return rng() < 0.5 ? { all: members } : { any: members };
	};
	const rules = Array.from({ length: sizes.rules }, (_, index) => {
		// The first rule of each cause supports it, so every cause is supported.
		const causeIndex = index % sizes.causes;
		const supports = index < sizes.causes || rng() < 0.6;
		const lr = supports ? 1.5 + rng() * 15 : 0.05 + rng() * 0.8;
		return makeRule({
			key: `rule-${index}`,
			cause: causes[causeIndex].key,
			lr: Number(lr.toFixed(3)),
			conditions: makeGroup(1),
			rationale: `Random rule ${index}.`
		});
	});
	const tests = Array.from({ length: testCount }, (_, index) =>
		makeTest({
			key: `test_${index}`,
			name: `Test ${index}`,
			minutes: 5 + Math.floor(rng() * 40),
			sets: observations[index].key
		})
	);
	return {
		meta: makeMeta({ name: `Random rulebook ${seed}` }),
		causes,
		observations,
		rules,
		tests
	};
}

/** Random answers: each observation answered with probability `answeredShare`, else left out or
 * set to null. Values are valid for the observation's kind. */
export function makeRandomFacts(
	rulebook: Rulebook,
	rng: () => number,
	answeredShare = 0.5
): Record<string, ObservationValue | null> {
	const facts: Record<string, ObservationValue | null> = {};
	for (const observation of rulebook.observations) {
		const roll = rng();
		if (roll >= answeredShare) {
			if (roll > (1 + answeredShare) / 2) facts[observation.key] = null;
			continue;
		}
		if (observation.kind === 'boolean') facts[observation.key] = rng() < 0.5;
		else if (observation.kind === 'enum') facts[observation.key] = pick(rng, observation.values);
		else facts[observation.key] = pick(rng, [0, 2.5, 5, 7.5, 10, 15, 20]);
	}
	return facts;
}

/** A diagnosis as the API shapes it (rounded), for tests that read responses. */
export async function diagnose(
	diagnoser: Diagnoser,
	input: DiagnoseInput,
	options: AnalyseOptions & ShapeOptions = {}
) {
	return shapeDiagnosis(await diagnoser.analyse(input, options), options);
}

/** Keys of the rules the look-ahead's compiled predicates fire on these answers, in rulebook
 * order: what the property tests compare with json-rules-engine. */
export function makePredicateEvaluator(rulebook: Rulebook) {
	const compiled = compileRulebook(rulebook);
	return (facts: Record<string, ObservationValue | null | undefined>) =>
		listFiredRuleKeys(
			compiled,
			evaluateCompiled(compiled, toFactVector(compiled, Object.entries(facts)))
		);
}
