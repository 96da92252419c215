import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { createDiagnoser } from '../src/lib/diagnosis';
const rb = loadRulebookFromDir('rules');
const d = createDiagnoser(rb);
const normal = {
  recent_coolant_service: false, coolant_overdue: false, topped_up_with_water: false, engine_overheated_severely: false,
  coolant_may_have_frozen: false, head_gasket_replaced_before: false, temp_gauge: 'normal', overheating_reported: false,
  coolant_level: 'full', level_drops_between_checks: false, loss_l_per_week: 0, visible_leak: 'none', puddle_under_vehicle: false,
  expansion_tank_overfills: false, sweet_smell: 'none', exhaust_smoke: 'none', steam_from_engine_bay: false, heater_output: 'normal',
  gurgling_behind_dash: false, wet_passenger_floor: false, windscreen_film: false, bubbles_in_filler: 'none',
  hoses_hard_soon_after_cold_start: false, upper_hose_cool_when_hot: false, lower_hose_collapses: false, hoses_collapse_when_cooling: false,
  fan_runs_when_hot: true, worse_with_ac_on: false, belt_condition: 'good', belt_squeal: false, charge_light_on: false,
  water_pump_noise_or_play: false, weep_hole_trace: false, radiator_fins_blocked: false, radiator_cold_spots: false,
  coolant_condition: 'clean', oil_milky: false, misfire_or_rough_cold_start: false, freeze_point_c: -37, pressure_test: 'holds',
  cap_test: 'holds_rating', combustion_gas_test: 'negative', cylinder_leakdown: 'normal', thermostat_check: 'opens_normally',
  fan_circuit_test: 'ok', ect_reading_vs_ir: 'agree', heater_core_check: 'dry', water_pump_check: 'ok', bleed_recheck: 'level_holds_symptoms_gone'
};
console.log(Object.keys(normal).length, rb.observations.length);
const r = await d.analyse({ observations: normal });
console.log(r.causes.map(c => `${c.key}:${c.probability.toFixed(5)}:${c.band}`).join('\n'));
// symptoms-only normal
const symptomKeys = rb.observations.filter(o => o.group !== 'test_result').map(o => o.key);
const r2 = await d.analyse({ observations: Object.fromEntries(symptomKeys.map(k => [k, (normal as any)[k]])) });
console.log('--- no tests'); console.log(r2.causes.slice(0,5).map(c => `${c.key}:${c.probability.toFixed(4)}:${c.band}`).join(' '));
