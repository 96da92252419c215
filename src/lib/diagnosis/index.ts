// The diagnosis engine: one diagnoser per rulebook edition ranks causes, next questions and tests.
import { buildComplaintMatcher, type ComplaintMatch } from './complaint';
import { buildEngineEvaluator } from './engine';
import {
	compileRulebook,
	listFiredRuleKeys,
	toFactVector,
	type CompiledRulebook,
	type FactVector
} from './evaluate';
import { adviseNextStep, findObservationMinutes, type Advice } from './advice';
import {
	computeQuestionGains,
	describeNextQuestions,
	prepareLookAhead,
	type FrequencyOverrides,
	type NextQuestion
} from './next-question';
import { formatIssuePath } from '../calculators/format';
import { rankCauses, sumLogOdds, type RankedCause } from './rank';
import {
	describeInvalidValue,
	parseRulebook,
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
export { replay, type ReplayCase, type ReplayResult } from './replay';
export type { Advice } from './advice';

export interface DiagnoseInput {
	/** `null` means not known, the same as leaving the key out. */
	observations: Record<string, ObservationValue | null>;
	/** Asked but could not be answered: no evidence, and not asked again. A key that also has
	 * an answer in `observations` counts as answered. */
	unknown?: string[];
	complaint?: string;
}

export interface AnalyseOptions {
	/** Answer frequencies for look-ahead, replacing the rulebook's per observation. */
	frequencies?: FrequencyOverrides;
	/** How many next questions to describe, best first. Default: all. */
	questionLimit?: number;
}

export interface DiagnoserOptions {
	frequencies?: FrequencyOverrides;
}

/** The causes ranked on the answers, at full precision: what replay compares. */
export interface Ranking {
	causes: RankedCause[];
	matched: ComplaintMatch[];
	/** The answers the ranking used (explicit and matched), in rulebook order. */
	facts: Record<string, ObservationValue>;
	/** Keys of the rules json-rules-engine fired, in rulebook order. */
	firedRules: string[];
}

/** Everything a diagnosis computes, at full precision (the API rounds it when it answers). */
export interface Analysis extends Ranking {
	nextQuestions: NextQuestion[];
	tests: PlannedTest[];
	cautions: string[];
	/** Whether questions are still worth asking, or the best test is next. */
	advice: Advice;
}

export interface Diagnoser {
	readonly rulebook: Rulebook;
	/** Ranks the causes only (no look-ahead, no test plan). */
	rank(input: DiagnoseInput): Promise<Ranking>;
	analyse(input: DiagnoseInput, options?: AnalyseOptions): Promise<Analysis>;
	/** Keys of the rules json-rules-engine fires on these answers, in rulebook order. */
	evaluateWithEngine(
		facts: Record<string, ObservationValue | null | undefined>,
		options?: { skipWaitingRules?: boolean }
	): Promise<string[]>;
	matchComplaint(complaint: string, skip?: ReadonlySet<string>): ComplaintMatch[];
	/** `validateObservations` against this edition, with its observations indexed once. */
	validateObservations(
		observations: Record<string, unknown>,
		unknown?: readonly unknown[]
	): RulebookIssue[];
}

/** How many of the first planned tests lend their cautions to the response's cautions. */
const FIRST_TESTS_WITH_CAUTIONS = 3;

function listUnique(items: Iterable<string>): string[] {
	return [...new Set(items)];
}

/** An edition made ready to answer: compiled once, shared by every request. */
interface PreparedEdition {
	book: Rulebook;
	compiled: CompiledRulebook;
	engine: ReturnType<typeof buildEngineEvaluator>;
	matcher: ReturnType<typeof buildComplaintMatcher>;
	testTargets: ReturnType<typeof findTestTargets>;
	observationMinutes: ReturnType<typeof findObservationMinutes>;
	causesByKey: Map<string, Rulebook['causes'][number]>;
	frequencies: DiagnoserOptions['frequencies'];
}

async function decide(ed: PreparedEdition, input: DiagnoseInput) {
	const { compiled, matcher, engine } = ed;
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
	const facts = toFactVector(compiled, [
		...explicit,
		...matched.map((match): [string, ObservationValue] => [match.key, match.value])
	]);
	const fired = await engine.run(facts, { skipWaitingRules: true });
	const logOdds = sumLogOdds(compiled, fired);
	return {
		unknown,
		matched,
		facts,
		fired,
		logOdds,
		causes: rankCauses(compiled, fired, logOdds)
	};
}

function describeFacts(book: Rulebook, facts: FactVector): Record<string, ObservationValue> {
	return Object.fromEntries(
		book.observations.flatMap((observation, index) =>
			facts[index] === undefined ? [] : [[observation.key, facts[index]]]
		)
	);
}

/** The edition's cautions, then those of the likely causes and of the first tests, once each. */
function listCautions(
	ed: PreparedEdition,
	causes: Awaited<ReturnType<typeof decide>>['causes'],
	tests: ReturnType<typeof planTests>
): string[] {
	return listUnique([
		...ed.book.meta.cautions,
		...causes
			.filter((cause) => cause.band === 'likely')
			.flatMap((cause) => ed.causesByKey.get(cause.key)?.cautions ?? []),
		...tests.slice(0, FIRST_TESTS_WITH_CAUTIONS).flatMap((test) => test.cautions)
	]);
}

async function analyse(
	ed: PreparedEdition,
	input: DiagnoseInput,
	runOptions: AnalyseOptions = {}
): Promise<Analysis> {
	const { compiled, book } = ed;
	const { unknown, matched, facts, fired, logOdds, causes } = await decide(ed, input);
	const gains = computeQuestionGains(
		compiled,
		{ facts, fired, logOdds },
		unknown,
		runOptions.frequencies ?? ed.frequencies
	);
	const causeOrder = causes.map((cause) => compiled.causeIndexByKey.get(cause.key) as number);
	const tests = planTests(
		compiled,
		ed.testTargets,
		gains,
		causeOrder,
		(key) => facts[compiled.observationIndexByKey.get(key) ?? -1] !== undefined || unknown.has(key)
	);
	const { advice, lowValue } = adviseNextStep(compiled, gains, ed.observationMinutes, tests);
	const nextQuestions = describeNextQuestions(compiled, gains, runOptions.questionLimit, lowValue);
	const cautions = listCautions(ed, causes, tests);
	return {
		causes,
		nextQuestions,
		tests,
		matched,
		cautions,
		advice,
		facts: describeFacts(book, facts),
		firedRules: listFiredRuleKeys(compiled, fired)
	};
}

/**
 * Builds everything an edition needs once (json-rules-engine, the look-ahead's predicates and
 * index, the complaint matcher); reuse the diagnoser for every request scored with that edition.
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
	const ed: PreparedEdition = {
		book,
		compiled,
		engine,
		matcher,
		testTargets: findTestTargets(compiled),
		observationMinutes: findObservationMinutes(compiled),
		causesByKey: new Map(book.causes.map((cause) => [cause.key, cause])),
		frequencies: options.frequencies
	};

	return {
		rulebook: book,
		analyse: (input, runOptions) => analyse(ed, input, runOptions),
		async rank(input) {
			const { matched, facts, fired, causes } = await decide(ed, input);
			return {
				causes,
				matched,
				facts: describeFacts(book, facts),
				firedRules: listFiredRuleKeys(compiled, fired)
			};
		},
		async evaluateWithEngine(facts, runOptions) {
			return listFiredRuleKeys(
				compiled,
				await engine.run(toFactVector(compiled, Object.entries(facts)), runOptions)
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
