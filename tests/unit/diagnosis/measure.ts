// Cost of the engine's parts per case, for the report and the performance spec.
// Run on its own: node --import tsx tests/unit/diagnosis/measure.ts [rules-dir]
import { existsSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { createDiagnoser, makeSyntheticRulebook, type Rulebook } from '../../../src/lib/diagnosis';
import {
	buildEngineEvaluator,
	compileRulebook,
	evaluateCompiled,
	toFactVector
} from '../../../src/lib/diagnosis/evaluate';
import { loadRulebookFromDir } from '../../../src/lib/diagnosis/load';
import { planNextQuestions } from '../../../src/lib/diagnosis/next-question';
import { sumLogOdds } from '../../../src/lib/diagnosis/rank';
import { createRng, makeRandomFacts, makeRandomRulebook } from './factories';

export interface Costs {
	label: string;
	rules: number;
	observations: number;
	engineRunMicros: number;
	engineRunSkippingMicros: number;
	compiledEvaluateMicros: number;
	nextQuestionMicros: number;
	diagnoseEngineMicros: number;
	diagnoseCompiledMicros: number;
	complaintMicros: number;
}

const SAMPLE_COMPLAINTS = [
	'gets hot sitting in traffic, fine on the motorway',
	'sweet smell inside the car and the windows fog up',
	'losing water but no leaks on the drive',
	'white smoke out the back all the time'
];

const PASSES = 3;

function takeMedian(values: number[]): number {
	return [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
}

/** µs per case: one warm-up pass over all cases, then the median of three timed passes. */
async function timeAsync(cases: number, run: (index: number) => Promise<unknown>): Promise<number> {
	const passes: number[] = [];
	for (let pass = 0; pass <= PASSES; pass++) {
		const start = performance.now();
		for (let index = 0; index < cases; index++) await run(index);
		if (pass > 0) passes.push(((performance.now() - start) * 1000) / cases);
	}
	return takeMedian(passes);
}

function timeSync(cases: number, run: (index: number) => unknown): number {
	const passes: number[] = [];
	for (let pass = 0; pass <= PASSES; pass++) {
		const start = performance.now();
		for (let index = 0; index < cases; index++) run(index);
		if (pass > 0) passes.push(((performance.now() - start) * 1000) / cases);
	}
	return takeMedian(passes);
}

export async function measureCosts(label: string, rulebook: Rulebook, cases = 300): Promise<Costs> {
	const rng = createRng(7);
	const inputs = Array.from({ length: cases }, () => makeRandomFacts(rulebook, rng, 0.3));
	const compiled = compileRulebook(rulebook);
	const factMaps = inputs.map((facts) => toFactVector(compiled, Object.entries(facts)));
	const engine = buildEngineEvaluator(compiled);
	const diagnoser = createDiagnoser(rulebook);
	const firedMasks = factMaps.map((facts) => evaluateCompiled(compiled, facts));
	const noneExcluded = new Set<string>();
	return {
		label,
		rules: rulebook.rules.length,
		observations: rulebook.observations.length,
		engineRunMicros: await timeAsync(cases, (index) => engine.run(factMaps[index])),
		engineRunSkippingMicros: await timeAsync(cases, (index) =>
			engine.run(factMaps[index], { skipWaitingRules: true })
		),
		compiledEvaluateMicros: timeSync(cases, (index) => evaluateCompiled(compiled, factMaps[index])),
		nextQuestionMicros: timeSync(cases, (index) =>
			planNextQuestions(
				compiled,
				{
					facts: factMaps[index],
					fired: firedMasks[index],
					logOdds: sumLogOdds(compiled, firedMasks[index])
				},
				noneExcluded
			)
		),
		diagnoseEngineMicros: await timeAsync(cases, (index) =>
			diagnoser.diagnose({ observations: inputs[index] }, { evaluator: 'engine' })
		),
		diagnoseCompiledMicros: await timeAsync(cases, (index) =>
			diagnoser.diagnose({ observations: inputs[index] }, { evaluator: 'compiled' })
		),
		complaintMicros: timeSync(cases, (index) =>
			diagnoser.matchComplaint(SAMPLE_COMPLAINTS[index % SAMPLE_COMPLAINTS.length])
		)
	};
}

export async function measureStandardCosts(rulesDir?: string): Promise<Costs[]> {
	const base = makeRandomRulebook(5, { causes: 19, observations: 35, rules: 100, tests: 8 });
	const results = [
		await measureCosts('random fixture, 100 rules', base),
		await measureCosts('synthetic 10x of it', makeSyntheticRulebook(base, 10), 100)
	];
	if (rulesDir && existsSync(`${rulesDir}/rules.json`)) {
		const shipped = loadRulebookFromDir(rulesDir);
		results.push(await measureCosts('rules/ (shipped)', shipped));
		results.push(
			await measureCosts('rules/ synthetic 10x', makeSyntheticRulebook(shipped, 10), 100)
		);
	}
	return results;
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const results = await measureStandardCosts(process.argv[2] ?? 'rules');
	console.table(
		results.map((cost) => ({
			rulebook: cost.label,
			rules: cost.rules,
			'engine.run µs': cost.engineRunMicros.toFixed(1),
			'engine.run skipping µs': cost.engineRunSkippingMicros.toFixed(1),
			'compiled µs': cost.compiledEvaluateMicros.toFixed(1),
			'next-question µs': cost.nextQuestionMicros.toFixed(1),
			'diagnose (engine) µs': cost.diagnoseEngineMicros.toFixed(1),
			'diagnose (compiled) µs': cost.diagnoseCompiledMicros.toFixed(1),
			'complaint µs': cost.complaintMicros.toFixed(1)
		}))
	);
}
