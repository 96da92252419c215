import { buildComplaintMatcher, type ComplaintMatch } from './complaint';
import {
	buildEngineEvaluator,
	compileRulebook,
	evaluateCompiled,
	listFiredRuleKeys,
	toFactVector,
	type FiredMask
} from './evaluate';
import { adviseNextStep, findObservationMinutes, type Advice } from './advice';
import {
	computeQuestionGains,
	describeNextQuestions,
	prepareLookAhead,
	roundGainBits,
	type FrequencyOverrides,
	type NextQuestion
} from './next-question';
import { rankCauses, sumLogOdds, type Evidence, type RankedCause } from './rank';
import {
	describeInvalidValue,
	formatIssuePath,
	parseRulebook,
	type Band,
	type Observation,
	type ObservationValue,
	type Rulebook,
	type RulebookIssue
} from './schema';
import { findTestTargets, planTests, type PlannedTest } from './test-plan';

export * from './schema';
export type { ComplaintMatch } from './complaint';
export type { Evidence, RankedCause } from './rank';
export type { FrequencyOverrides, NextQuestion, AnswerOption } from './next-question';
export type { PlannedTest } from './test-plan';
export type { Advice } from './advice';
export { makeSyntheticRulebook } from './synthetic';

export type Evaluator = 'engine' | 'compiled';

export interface DiagnoseInput {
	/** `null` means not known, the same as leaving the key out. */
	observations: Record<string, ObservationValue | null>;
	/** Asked but could not be answered: no evidence, and not asked again. A key that also has
	 * an answer in `observations` counts as answered. */
	unknown?: string[];
	complaint?: string;
}

export interface DiagnoseOptions {
	/** Which evaluator decides the fired rules. Both give identical results. Default: the
	 * diagnoser's default, itself 'engine' unless set. */
	evaluator?: Evaluator;
	/** Answer frequencies for look-ahead, replacing the rulebook's per observation. */
	frequencies?: FrequencyOverrides;
	/** `diagnose` only: how many next questions to describe, best first. Default: all. */
	questionLimit?: number;
	/** `diagnose` only: include each test's steps (default true). */
	testSteps?: boolean;
}

export interface DiagnoserOptions {
	evaluator?: Evaluator;
	frequencies?: FrequencyOverrides;
}

export interface DiagnosedCause {
	key: string;
	name: string;
	probability: number;
	band: Band;
	evidence: Evidence[];
}

export type DiagnosedTest = Omit<PlannedTest, 'steps'> & { steps?: string[] };

export interface Diagnosis {
	causes: DiagnosedCause[];
	nextQuestions: NextQuestion[];
	tests: DiagnosedTest[];
	matched: ComplaintMatch[];
	cautions: string[];
	/** Whether questions are still worth asking, or the best test is next. */
	advice: Advice;
}

/** Everything `diagnose` computes, at full precision (for replay, tuning and tests). */
export interface Analysis {
	causes: RankedCause[];
	nextQuestions: NextQuestion[];
	tests: PlannedTest[];
	matched: ComplaintMatch[];
	cautions: string[];
	advice: Advice;
	/** The answers the ranking used (explicit and matched), in rulebook order. */
	facts: Record<string, ObservationValue>;
	firedRules: string[];
}

export interface Diagnoser {
	readonly rulebook: Rulebook;
	diagnose(input: DiagnoseInput, options?: DiagnoseOptions): Promise<Diagnosis>;
	analyse(input: DiagnoseInput, options?: DiagnoseOptions): Promise<Analysis>;
	/** Keys of the rules json-rules-engine fires on these answers, in rulebook order. */
	evaluateWithEngine(facts: Record<string, ObservationValue | null | undefined>): Promise<string[]>;
	/** Keys of the rules the compiled predicates fire on these answers, in rulebook order. */
	evaluateCompiled(facts: Record<string, ObservationValue | null | undefined>): string[];
	matchComplaint(complaint: string, skip?: ReadonlySet<string>): ComplaintMatch[];
	/** `validateObservations` against this edition, with its observations indexed once. */
	validateObservations(
		observations: Record<string, unknown>,
		unknown?: readonly unknown[]
	): RulebookIssue[];
}

/** How many of the first planned tests lend their cautions to the response's cautions. */
const FIRST_TESTS_WITH_CAUTIONS = 3;

function roundTo(value: number, decimals: number): number {
	const factor = 10 ** decimals;
	const rounded = Math.round(value * factor) / factor;
	return rounded === 0 ? 0 : rounded;
}

function listUnique(items: Iterable<string>): string[] {
	return [...new Set(items)];
}

/**
 * Builds everything an edition needs once (engine, compiled predicates, look-ahead index,
 * complaint matcher); reuse the diagnoser for every request scored with that edition.
 * Throws when the rulebook does not pass `rulebookSchema`.
 */
export function createDiagnoser(rulebook: Rulebook, options: DiagnoserOptions = {}): Diagnoser {
	const parsed = parseRulebook(rulebook);
	if (!parsed.ok) {
		throw new Error(
			`invalid rulebook:\n${parsed.issues.map((issue) => `  ${issue.path}: ${issue.message}`).join('\n')}`
		);
	}
	const book = parsed.rulebook;
	const compiled = compileRulebook(book);
	const engine = buildEngineEvaluator(compiled);
	prepareLookAhead(compiled);
	const matcher = buildComplaintMatcher(book);
	const testTargets = findTestTargets(compiled);
	const observationMinutes = findObservationMinutes(compiled);
	const causesByKey = new Map(book.causes.map((cause) => [cause.key, cause]));
	const defaultEvaluator = options.evaluator ?? 'engine';

	async function score(input: DiagnoseInput, runOptions: DiagnoseOptions = {}) {
		const unknown = new Set(
			(input.unknown ?? []).filter((key) => compiled.observationsByKey.has(key))
		);
		// Only own keys count: an observation named like an Object.prototype member must not
		// read an inherited value.
		const explicit = Object.entries(input.observations).filter(
			([key, value]) => value !== null && value !== undefined && compiled.observationsByKey.has(key)
		) as [string, ObservationValue][];
		const settled = new Set([...explicit.map(([key]) => key), ...unknown]);
		const matched = input.complaint ? matcher.matchComplaint(input.complaint, settled) : [];
		const answers: [string, ObservationValue][] = [
			...explicit,
			...matched.map((match): [string, ObservationValue] => [match.key, match.value])
		];
		const facts = toFactVector(compiled, answers);
		const isAnswered = (key: string) =>
			facts[compiled.observationIndexByKey.get(key) ?? -1] !== undefined;

		const evaluator = runOptions.evaluator ?? defaultEvaluator;
		const fired: FiredMask =
			evaluator === 'engine'
				? await engine.run(facts, { skipWaitingRules: true })
				: evaluateCompiled(compiled, facts);
		const logOdds = sumLogOdds(compiled, fired);
		const causes = rankCauses(compiled, fired, logOdds);
		const causeOrder = causes.map((cause) => compiled.causeIndexByKey.get(cause.key) as number);

		const gains = computeQuestionGains(
			compiled,
			{ facts, fired, logOdds },
			unknown,
			runOptions.frequencies ?? options.frequencies
		);
		const tests = planTests(
			compiled,
			testTargets,
			gains,
			causeOrder,
			(key) => isAnswered(key) || unknown.has(key)
		);
		const { advice, lowValue } = adviseNextStep(compiled, gains, observationMinutes, tests);
		const nextQuestions = describeNextQuestions(
			compiled,
			gains,
			runOptions.questionLimit,
			lowValue
		);
		const cautions = listUnique([
			...book.meta.cautions,
			...causes
				.filter((cause) => cause.band === 'likely')
				.flatMap((cause) => causesByKey.get(cause.key)?.cautions ?? []),
			...tests.slice(0, FIRST_TESTS_WITH_CAUTIONS).flatMap((test) => test.cautions)
		]);
		return { causes, nextQuestions, tests, matched, cautions, advice, facts, fired };
	}

	async function analyse(input: DiagnoseInput, runOptions?: DiagnoseOptions): Promise<Analysis> {
		const { facts, fired, ...scored } = await score(input, runOptions);
		return {
			...scored,
			facts: Object.fromEntries(
				book.observations.flatMap((observation, index) =>
					facts[index] === undefined ? [] : [[observation.key, facts[index]]]
				)
			),
			firedRules: listFiredRuleKeys(compiled, fired)
		};
	}

	return {
		rulebook: book,
		analyse,
		async diagnose(input, runOptions) {
			const analysis = await score(input, runOptions);
			const withSteps = runOptions?.testSteps ?? true;
			const causes: DiagnosedCause[] = analysis.causes.map((cause) => ({
				key: cause.key,
				name: cause.name,
				probability: roundTo(cause.probability, 4),
				band: cause.band,
				evidence: cause.evidence
			}));
			for (const question of analysis.nextQuestions) {
				question.expectedGain = roundGainBits(question.expectedGain);
			}
			const tests = analysis.tests.map((test): DiagnosedTest => {
				const shown: DiagnosedTest = {
					key: test.key,
					name: test.name,
					minutes: test.minutes,
					targets: test.targets,
					priority: test.priority,
					cautions: test.cautions,
					equipment: test.equipment,
					sets: test.sets,
					score: roundTo(test.score, 6)
				};
				if (withSteps) shown.steps = test.steps;
				return shown;
			});
			return {
				causes,
				nextQuestions: analysis.nextQuestions,
				tests,
				matched: analysis.matched.map((match) => ({ ...match, score: roundTo(match.score, 4) })),
				cautions: analysis.cautions,
				advice: analysis.advice
			};
		},
		async evaluateWithEngine(facts) {
			return listFiredRuleKeys(
				compiled,
				await engine.run(toFactVector(compiled, Object.entries(facts)))
			);
		},
		evaluateCompiled(facts) {
			return listFiredRuleKeys(
				compiled,
				evaluateCompiled(compiled, toFactVector(compiled, Object.entries(facts)))
			);
		},
		matchComplaint(complaint, skip) {
			return matcher.matchComplaint(complaint, skip);
		},
		validateObservations(observations, unknown) {
			return checkObservations(compiled.observationsByKey, observations, unknown);
		}
	};
}

/**
 * Checks a request's answers against the rulebook: unknown keys, wrong kinds, enum values not
 * allowed, numbers out of range or not finite, unknown keys in `unknown`.
 */
export function validateObservations(
	rulebook: Rulebook,
	observations: Record<string, unknown>,
	unknown: readonly unknown[] = []
): RulebookIssue[] {
	const byKey = new Map(rulebook.observations.map((observation) => [observation.key, observation]));
	return checkObservations(byKey, observations, unknown);
}

function checkObservations(
	byKey: ReadonlyMap<string, Observation>,
	observations: Record<string, unknown>,
	unknown: readonly unknown[] = []
): RulebookIssue[] {
	const issues: RulebookIssue[] = [];
	for (const [key, value] of Object.entries(observations)) {
		const path = formatIssuePath(['observations', key]);
		const observation = byKey.get(key);
		if (!observation) {
			issues.push({ path, message: `unknown observation "${key}"` });
			continue;
		}
		if (value === null) continue;
		const reason = describeInvalidValue(observation, value);
		if (reason) issues.push({ path, message: reason });
	}
	unknown.forEach((key, index) => {
		if (typeof key !== 'string' || !byKey.has(key)) {
			issues.push({
				path: formatIssuePath(['unknown', index]),
				message: `unknown observation ${JSON.stringify(key)}`
			});
		}
	});
	return issues;
}
