// The diagnosis as the API answers it: an analysis rounded and trimmed to the contract's shape.
import type {
	Advice,
	Analysis,
	Band,
	ComplaintMatch,
	Evidence,
	NextQuestion,
	PlannedTest
} from '../diagnosis';
import {
	GAIN_DECIMALS,
	MATCH_SCORE_DECIMALS,
	PROBABILITY_DECIMALS,
	TEST_SCORE_DECIMALS
} from './round';
import { roundTo } from '../calculators/format';

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

export interface ShapeOptions {
	/** Include each test's steps (default true); an intake form has no use for them. */
	testSteps?: boolean;
}

function shapeTest(test: PlannedTest, withSteps: boolean): DiagnosedTest {
	const shown: DiagnosedTest = {
		key: test.key,
		name: test.name,
		minutes: test.minutes,
		targets: test.targets,
		priority: test.priority,
		cautions: test.cautions,
		equipment: test.equipment,
		sets: test.sets,
		score: roundTo(test.score, TEST_SCORE_DECIMALS)
	};
	if (withSteps) shown.steps = test.steps;
	return shown;
}

/** The analysis with every figure rounded as the contract states, in the contract's field order. */
export function shapeDiagnosis(analysis: Analysis, options: ShapeOptions = {}): Diagnosis {
	const withSteps = options.testSteps ?? true;
	return {
		causes: analysis.causes.map((cause) => ({
			key: cause.key,
			name: cause.name,
			probability: roundTo(cause.probability, PROBABILITY_DECIMALS),
			band: cause.band,
			evidence: cause.evidence
		})),
		nextQuestions: analysis.nextQuestions.map((question) => ({
			...question,
			expectedGain: roundTo(question.expectedGain, GAIN_DECIMALS)
		})),
		tests: analysis.tests.map((test) => shapeTest(test, withSteps)),
		matched: analysis.matched.map((match) => ({
			...match,
			score: roundTo(match.score, MATCH_SCORE_DECIMALS)
		})),
		cautions: analysis.cautions,
		advice: analysis.advice
	};
}
