// Scores a case's current state with its edition: the ranking stored with each event and the
// diagnosis (ranking, next questions, tests) the case page shows.
import type { Observation, ConfirmingTest, Rulebook } from '../../diagnosis';
import { toDiagnoseInput, type CaseState } from '../../cases/answers';
import { shapeDiagnosis } from '../../api/diagnosis-response';
import type { PublishedEdition } from '../editions';
import { toRanking } from './store';

/** As many next questions as the diagnose API answers with. */
export const CASE_QUESTION_LIMIT = 10;

type RulebookIndex = {
	observations: Map<string, Observation>;
	tests: Map<string, ConfirmingTest>;
};

const indexes = new WeakMap<Rulebook, RulebookIndex>();

/** The edition's observations and tests by key, built once per rulebook. */
export function indexRulebook(rulebook: Rulebook): RulebookIndex {
	let index = indexes.get(rulebook);
	if (!index) {
		index = {
			observations: new Map(rulebook.observations.map((o) => [o.key, o])),
			tests: new Map(rulebook.tests.map((t) => [t.key, t]))
		};
		indexes.set(rulebook, index);
	}
	return index;
}

/** Ranks the state's answers; complaint matches count only once accepted (they are answers then). */
export async function scoreCase(
	edition: PublishedEdition,
	state: CaseState,
	options: { testSteps: boolean }
) {
	const { observations } = indexRulebook(edition.rulebook);
	const input = toDiagnoseInput(state, (key) => observations.has(key));
	const analysis = await edition.diagnoser.analyse(input, { questionLimit: CASE_QUESTION_LIMIT });
	const { causes, nextQuestions, tests, cautions } = shapeDiagnosis(analysis, {
		testSteps: options.testSteps
	});
	return { diagnosis: { causes, nextQuestions, tests, cautions }, ranking: toRanking(causes) };
}

export type CaseDiagnosis = Awaited<ReturnType<typeof scoreCase>>['diagnosis'];
