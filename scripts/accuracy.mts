// npm run accuracy: how the shipped rulebook ranks simulated noisy cars, for the tuning and the held-out profiles.
// Tuning profiles may guide weight changes (each such weight says "tuned on simulated cars");
// the held-out profiles, written separately and simulated with another seed and noise model,
// are only ever measured. ACCURACY_CARS and ACCURACY_WALKS set how many cars each part uses.
import { createDiagnoser, type Diagnosis, type Rulebook } from '../src/lib/diagnosis';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import {
	adaptiveQuestion,
	countMinutes,
	countQuestions,
	fixedQuestion,
	fixedSteps,
	measureRanking,
	comparePaired,
	type StepChooser,
	type WalkResult
} from '../tests/support/accuracy/measure';
import { loadProfiles } from '../tests/support/accuracy/profiles';
import { simulateCars, type NoiseModel } from '../tests/support/accuracy/simulate';

const CARS = Number(process.env.ACCURACY_CARS ?? 2000);
const WALKS = Number(process.env.ACCURACY_WALKS ?? 300);
const BY_CAUSE = process.argv.includes('--by-cause');

const SETS: { file: string; seed: number; noise: NoiseModel }[] = [
	{
		file: 'tests/support/accuracy/profiles/tuning.json',
		seed: 1301,
		noise: {
			name: '20 % missing, 7 % wrong (any other answer)',
			...{ missingRate: 0.2, wrongRate: 0.07, wrongAnswers: 'uniform', secondFaultRate: 0 }
		}
	},
	{
		file: 'tests/support/accuracy/profiles/held-out.json',
		seed: 9127,
		noise: {
			name: '30 % missing, 10 % wrong (common answers), 15 % with a second fault',
			...{ missingRate: 0.3, wrongRate: 0.1, wrongAnswers: 'common', secondFaultRate: 0.15 }
		}
	}
];

const percent = (part: number, whole: number) => `${((100 * part) / whole).toFixed(1)} %`;

/** The product's own walk: its best question while one is worth asking, then its advice's test
 * (or, to isolate the plan, the rulebook's tests in a fixed order). */
function productSteps(tests: 'plan' | 'fixed', rulebook: Rulebook): StepChooser {
	const tested = rulebook.tests.map((test) => test.sets);
	return (diagnosis: Diagnosis, walk) => {
		if (!diagnosis.advice.stop) {
			const question = diagnosis.nextQuestions.find(
				(entry) => !entry.lowValue && !tested.includes(entry.key)
			);
			if (question) return question.key;
		}
		const next =
			tests === 'plan'
				? diagnosis.tests[0]?.sets
				: tested.find((key) => !walk.asked.has(key) && !(key in walk.observations));
		// With every test done, the questions left are all that can still be asked.
		return next ?? diagnosis.nextQuestions[0]?.key;
	};
}

async function measureSet(rulebook: Rulebook, set: (typeof SETS)[number]) {
	const diagnoser = createDiagnoser(rulebook);
	const profiles = loadProfiles(set.file, rulebook);
	const cars = simulateCars(rulebook, profiles, set.noise, CARS, set.seed);
	console.log(`\n## ${profiles.name} profiles (${profiles.source}); noise: ${set.noise.name}`);
	for (const withMissing of [false, true]) {
		const f = await measureRanking(diagnoser, profiles, set.noise, cars, withMissing);
		console.log(
			`${withMissing ? 'part answered ' : 'every answer  '} ${f.cars} cars: ` +
				`top-1 ${percent(f.top1, f.cars)}, top-3 ${percent(f.top3, f.cars)}; ` +
				`Bayes limit top-1 ${percent(f.bayesTop1, f.cars)}, top-3 ${percent(f.bayesTop3, f.cars)}`
		);
		if (withMissing) continue;
		console.log(
			'  reliability of the top cause (every answer):  called  | cars | mean called | right'
		);
		for (const bin of f.reliability.filter((entry) => entry.cars > 0)) {
			console.log(
				`    ${bin.low.toFixed(1)}–${Math.min(bin.high, 1).toFixed(1)} | ${String(bin.cars).padStart(4)} | ` +
					`${bin.meanCalled.toFixed(2).padStart(11)} | ${percent(bin.right, bin.cars)}`
			);
		}
		if (BY_CAUSE) {
			for (const [key, entry] of f.byCause) {
				console.log(
					`    ${key.padEnd(26)} ${String(entry.cars).padStart(4)}  ${percent(entry.top1, entry.cars)}`
				);
			}
		}
	}
	const walks = cars.slice(0, WALKS);
	const run = (fn: (car: (typeof walks)[number]) => Promise<WalkResult>) =>
		Promise.all(walks.map(fn));
	const [adaptive, fixed] = comparePaired([
		await run((car) => countQuestions(diagnoser, car, 0.5, adaptiveQuestion)),
		await run((car) => countQuestions(diagnoser, car, 0.5, fixedQuestion(rulebook)))
	]);
	console.log(
		`questions to a fault at 50 % (${walks.length} cars): reached adaptive ${percent(adaptive.reached, 1)}, ` +
			`fixed ${percent(fixed.reached, 1)}; on the ${adaptive.paired} both reached: adaptive ` +
			`${adaptive.mean.toFixed(1)}, fixed questionnaire ${fixed.mean.toFixed(1)}, ratio ${(adaptive.mean / fixed.mean).toFixed(2)}`
	);
	const [plan, planFixed, allFixed] = comparePaired([
		await run((car) => countMinutes(diagnoser, car, 0.8, productSteps('plan', rulebook))),
		await run((car) => countMinutes(diagnoser, car, 0.8, productSteps('fixed', rulebook))),
		await run((car) => countMinutes(diagnoser, car, 0.8, fixedSteps(rulebook)))
	]);
	console.log(
		`minutes to a fault at 80 % (a question 1 min, a test its minutes), reached: product walk ` +
			`${percent(plan.reached, 1)}, its questions then tests in a fixed order ${percent(planFixed.reached, 1)}, ` +
			`fixed questions then fixed tests ${percent(allFixed.reached, 1)}; on the ${plan.paired} all reached: ` +
			`${plan.mean.toFixed(0)}, ${planFixed.mean.toFixed(0)}, ${allFixed.mean.toFixed(0)} min`
	);
}

const rulebook = loadRulebookFromDir('rules');
for (const set of SETS) await measureSet(rulebook, set);
