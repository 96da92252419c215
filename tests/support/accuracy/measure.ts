// Accuracy of the diagnoser on simulated cars: ranking, the profiles' Bayes limit, reliability, questions and minutes.
import type { Diagnoser, Analysis, ObservationValue, Rulebook } from '../../../src/lib/diagnosis';
import { listAnswerKeys } from '../../../src/lib/diagnosis/schema';
import type { ProfileSet } from './profiles';
import { binOf, wrongAnswerChance, type NoiseModel, type SimulatedCar } from './simulate';

export interface RankingFigures {
	cars: number;
	top1: number;
	top3: number;
	bayesTop1: number;
	bayesTop3: number;
	/** Of the cars whose top cause was called p in [low, high), how many had it. */
	reliability: { low: number; high: number; cars: number; meanCalled: number; right: number }[];
	/** Per cause: cars with it as first fault, and how often it ranked first. */
	byCause: Map<string, { cars: number; top1: number }>;
}

const RELIABILITY_EDGES = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.000001];

function keyOf(rulebook: Rulebook, key: string, value: ObservationValue): string {
	const observation = rulebook.observations.find((entry) => entry.key === key)!;
	return observation.kind === 'number' ? binOf(observation, value as number) : String(value);
}

/**
 * The Bayes limit: a single-fault naive Bayes classifier that knows the profiles, the causes'
 * priors and the noise model, so it is the best any ranking can do on single-fault cars.
 * Returns cause keys, most probable first.
 */
export function rankByBayes(
	rulebook: Rulebook,
	profiles: ProfileSet,
	noise: NoiseModel,
	answers: Record<string, ObservationValue>
): string[] {
	const scores = rulebook.causes.map((cause) => {
		let logScore = Math.log(cause.prior);
		const row = profiles.table.get(cause.key)!;
		for (const [key, value] of Object.entries(answers)) {
			const observation = rulebook.observations.find((entry) => entry.key === key)!;
			const observed = keyOf(rulebook, key, value);
			const truth = row.get(key)!;
			let chance = (1 - noise.wrongRate) * truth[observed];
			for (const actual of listAnswerKeys(observation)) {
				chance +=
					noise.wrongRate * truth[actual] * wrongAnswerChance(observation, noise, actual, observed);
			}
			logScore += Math.log(Math.max(chance, 1e-9));
		}
		return { key: cause.key, logScore };
	});
	return scores.sort((a, b) => b.logScore - a.logScore).map((score) => score.key);
}

function givenAnswers(car: SimulatedCar, withMissing: boolean) {
	return Object.fromEntries(
		Object.entries(car.reported).filter(([key]) => !withMissing || !car.missing.has(key))
	);
}

export async function measureRanking(
	diagnoser: Diagnoser,
	profiles: ProfileSet,
	noise: NoiseModel,
	cars: SimulatedCar[],
	withMissing: boolean
): Promise<RankingFigures> {
	const rulebook = diagnoser.rulebook;
	const figures: RankingFigures = {
		cars: cars.length,
		...{ top1: 0, top3: 0, bayesTop1: 0, bayesTop3: 0 },
		reliability: RELIABILITY_EDGES.slice(0, -1).map((low, index) => ({
			...{ low, high: RELIABILITY_EDGES[index + 1] },
			...{ cars: 0, meanCalled: 0, right: 0 }
		})),
		byCause: new Map(rulebook.causes.map((cause) => [cause.key, { cars: 0, top1: 0 }]))
	};
	for (const car of cars) {
		const observations = givenAnswers(car, withMissing);
		const diagnosis = await diagnoser.analyse({ observations });
		const ranked = diagnosis.causes.map((cause) => cause.key);
		const bayes = rankByBayes(rulebook, profiles, noise, observations);
		const isFault = (key: string) => car.faults.includes(key);
		figures.top1 += isFault(ranked[0]) ? 1 : 0;
		figures.top3 += ranked.slice(0, 3).some(isFault) ? 1 : 0;
		figures.bayesTop1 += isFault(bayes[0]) ? 1 : 0;
		figures.bayesTop3 += bayes.slice(0, 3).some(isFault) ? 1 : 0;
		const called = diagnosis.causes[0].probability;
		const bin = figures.reliability.find((entry) => called >= entry.low && called < entry.high)!;
		bin.cars += 1;
		bin.meanCalled += called;
		bin.right += isFault(ranked[0]) ? 1 : 0;
		const perCause = figures.byCause.get(car.faults[0])!;
		perCause.cars += 1;
		perCause.top1 += ranked[0] === car.faults[0] ? 1 : 0;
	}
	for (const bin of figures.reliability) bin.meanCalled = bin.cars ? bin.meanCalled / bin.cars : 0;
	return figures;
}

/** Where a walk stood when it stopped: what it spent, and whether a fault reached the target. */
export interface WalkResult {
	spent: number;
	reached: boolean;
}

export interface Walk {
	observations: Record<string, ObservationValue>;
	unknown: string[];
	asked: Set<string>;
}

function faultProbability(diagnosis: Analysis, car: SimulatedCar): number {
	return Math.max(
		...diagnosis.causes.filter((cause) => car.faults.includes(cause.key)).map((c) => c.probability)
	);
}

function answer(walk: Walk, car: SimulatedCar, key: string) {
	walk.asked.add(key);
	if (car.missing.has(key)) walk.unknown.push(key);
	else walk.observations[key] = car.reported[key];
}

export type QuestionChooser = (diagnosis: Analysis, walk: Walk) => string | undefined;

/** Questions (every observation that is not a test result) asked until a fault of the car
 * reaches `target`; a walk that runs out of questions counts every question it asked. */
export async function countQuestions(
	diagnoser: Diagnoser,
	car: SimulatedCar,
	target: number,
	choose: QuestionChooser
): Promise<WalkResult> {
	const walk: Walk = { observations: {}, unknown: [], asked: new Set() };
	const limit = diagnoser.rulebook.observations.length;
	for (let spent = 0; spent <= limit; spent++) {
		const diagnosis = await diagnoser.analyse(walk);
		if (faultProbability(diagnosis, car) >= target) return { spent, reached: true };
		const key = choose(diagnosis, walk);
		if (key === undefined) return { spent, reached: false };
		answer(walk, car, key);
	}
	return { spent: limit, reached: false };
}

/** The best question by the diagnoser's own order, test results left to the tests. */
export function adaptiveQuestion(diagnosis: Analysis): string | undefined {
	return diagnosis.nextQuestions.find((question) => question.group !== 'test_result')?.key;
}

/** A fixed questionnaire: the rulebook's questions in the order they are written. */
export function fixedQuestion(rulebook: Rulebook): QuestionChooser {
	const order = rulebook.observations.filter((o) => o.group !== 'test_result').map((o) => o.key);
	return (_diagnosis, walk) => order.find((key) => !walk.asked.has(key));
}

/** A step of a timed walk: an observation to settle, costing its test's minutes if a test sets
 * it and one minute otherwise. */
export type StepChooser = (diagnosis: Analysis, walk: Walk) => string | undefined;

export function minutesOf(rulebook: Rulebook): (key: string) => number {
	const byObservation = new Map(rulebook.tests.map((test) => [test.sets, test.minutes]));
	return (key) => byObservation.get(key) ?? 1;
}

/** Minutes spent until a fault of the car reaches `target`. */
export async function countMinutes(
	diagnoser: Diagnoser,
	car: SimulatedCar,
	target: number,
	choose: StepChooser
): Promise<WalkResult> {
	const walk: Walk = { observations: {}, unknown: [], asked: new Set() };
	const cost = minutesOf(diagnoser.rulebook);
	let spent = 0;
	for (let step = 0; step <= diagnoser.rulebook.observations.length; step++) {
		const diagnosis = await diagnoser.analyse(walk);
		if (faultProbability(diagnosis, car) >= target) return { spent, reached: true };
		const key = choose(diagnosis, walk);
		if (key === undefined) break;
		spent += cost(key);
		// A test always gives a result; only a question can go unanswered.
		if (diagnoser.rulebook.tests.some((test) => test.sets === key)) {
			walk.asked.add(key);
			walk.observations[key] = car.reported[key];
		} else answer(walk, car, key);
	}
	return { spent, reached: false };
}

/** Questions first, in the fixed order, then every test in the rulebook's order. */
export function fixedSteps(rulebook: Rulebook): StepChooser {
	const tested = new Set(rulebook.tests.map((test) => test.sets));
	const order = [
		...rulebook.observations.filter((o) => !tested.has(o.key) && o.group !== 'test_result'),
		...rulebook.tests.map((test) => ({ key: test.sets }))
	].map((entry) => entry.key);
	return (_diagnosis, walk) => order.find((key) => !walk.asked.has(key));
}

/** Strategies compared on the same cars: how often each reached the target, and the mean
 * spent by each over the cars that every one of them reached (a walk that never reaches the
 * target has no cost to compare). */
export function comparePaired(results: WalkResult[][]) {
	const cars = results[0].length;
	const shared = results[0].map((_, car) => results.every((strategy) => strategy[car].reached));
	const pairedCount = shared.filter(Boolean).length;
	return results.map((strategy) => ({
		reached: strategy.filter((result) => result.reached).length / cars,
		paired: pairedCount,
		mean:
			strategy.reduce((sum, result, car) => (shared[car] ? sum + result.spent : sum), 0) /
			pairedCount
	}));
}
