import { existsSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createDiagnoser, type ObservationValue } from '../../../src/lib/diagnosis';
import { loadRulebookFromDir } from '../../../src/lib/diagnosis/load';
import { createRng, diagnose, makePredicateEvaluator, makeRandomFacts } from './factories';

// Engine behaviour on the shipped base rulebook in rules/ (written separately from the engine).
const RULES_DIR = 'rules';
const hasShippedRulebook = existsSync(`${RULES_DIR}/meta.json`);

/** What a healthy cooling system answers to each question of the base rulebook. */
const HEALTHY_ANSWERS: Record<string, ObservationValue> = {
	recent_coolant_service: false,
	coolant_overdue: false,
	topped_up_with_water: false,
	engine_overheated_severely: false,
	coolant_may_have_frozen: false,
	head_gasket_replaced_before: false,
	temp_gauge: 'normal',
	overheating_reported: false,
	coolant_level: 'full',
	level_drops_between_checks: false,
	loss_l_per_week: 0,
	visible_leak: 'none',
	puddle_under_vehicle: false,
	expansion_tank_overfills: false,
	sweet_smell: 'none',
	exhaust_smoke: 'none',
	steam_from_engine_bay: false,
	heater_output: 'normal',
	gurgling_behind_dash: false,
	wet_passenger_floor: false,
	windscreen_film: false,
	bubbles_in_filler: 'none',
	hoses_hard_soon_after_cold_start: false,
	upper_hose_cool_when_hot: false,
	lower_hose_collapses: false,
	hoses_collapse_when_cooling: false,
	fan_runs_when_hot: true,
	worse_with_ac_on: false,
	belt_condition: 'good',
	belt_squeal: false,
	charge_light_on: false,
	water_pump_noise_or_play: false,
	weep_hole_trace: false,
	radiator_fins_blocked: false,
	radiator_cold_spots: false,
	coolant_condition: 'clean',
	oil_milky: false,
	misfire_or_rough_cold_start: false,
	// A 50 % ethylene glycol mix freezes near −37 °C (US Army TM 5-3895-382-24; an equipment operator's manual, OMSU31337).
	freeze_point_c: -37,
	pressure_test: 'holds',
	cap_test: 'holds_rating',
	combustion_gas_test: 'negative',
	cylinder_leakdown: 'normal',
	thermostat_check: 'opens_normally',
	fan_circuit_test: 'ok',
	ect_reading_vs_ir: 'agree',
	heater_core_check: 'dry',
	water_pump_check: 'ok',
	bleed_recheck: 'level_holds_symptoms_gone'
};

describe.runIf(hasShippedRulebook)('the shipped rulebook', () => {
	const rulebook = hasShippedRulebook ? loadRulebookFromDir(RULES_DIR) : undefined;
	const diagnoser = rulebook ? createDiagnoser(rulebook) : undefined;

	it('gives exactly the priors with no evidence', async () => {
		const analysis = await diagnoser!.analyse({ observations: {} });
		for (const cause of rulebook!.causes) {
			const ranked = analysis.causes.find((entry) => entry.key === cause.key);
			expect(ranked?.probability).toBeCloseTo(cause.prior, 12);
		}
		expect(analysis.causes.some((cause) => cause.band === 'likely')).toBe(false);
	});

	it('calls nothing likely or even possible when every answer is the healthy one', async () => {
		const healthyKeys = Object.keys(HEALTHY_ANSWERS);
		// Every question has a healthy answer here; a new observation needs one too.
		expect(
			rulebook!.observations.map((obs) => obs.key).filter((key) => !healthyKeys.includes(key))
		).toEqual([]);
		const observations = Object.fromEntries(
			Object.entries(HEALTHY_ANSWERS).filter(([key]) =>
				rulebook!.observations.some((obs) => obs.key === key)
			)
		);
		const diagnosis = await diagnose(diagnoser!, { observations });
		expect(diagnosis.causes.filter((cause) => cause.band !== 'unlikely')).toEqual([]);
	});

	it('fires the same rules through the engine and the compiled predicates', async () => {
		const evaluateCompiled = makePredicateEvaluator(rulebook!);
		const rng = createRng(303);
		for (let run = 0; run < 200; run++) {
			const facts = makeRandomFacts(rulebook!, rng, [0.2, 0.5, 0.8][run % 3]);
			expect(evaluateCompiled(facts)).toEqual(await diagnoser!.evaluateWithEngine(facts));
		}
	}, 60_000);

	it('reads the four sample complaints with the shipped phrases', () => {
		const cases: [string, string, ObservationValue][] = [
			['gets hot sitting in traffic, fine on the motorway', 'temp_gauge', 'high_at_idle'],
			['sweet smell inside the car and the windows fog up', 'sweet_smell', 'cabin'],
			['losing water but no leaks on the drive', 'level_drops_between_checks', true],
			['white smoke out the back all the time', 'exhaust_smoke', 'white_persistent']
		];
		for (const [complaint, key, value] of cases) {
			const matched = diagnoser!.matchComplaint(complaint);
			expect(matched, complaint).toContainEqual(expect.objectContaining({ key, value }));
			// "fine on the motorway" must not turn into overheating at speed.
			expect(matched).not.toContainEqual(
				expect.objectContaining({ key: 'temp_gauge', value: 'high_at_speed' })
			);
		}
	});
});
