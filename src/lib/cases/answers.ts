// A case's current state derived from its timeline: answers (later wins, in server order),
// "not sure" keys, decided complaint matches and ticked test steps. Pure, for the server and
// the case page alike.
import type { EventKind } from './model';

export type AnswerValue = boolean | string | number;

/** An event as stored: `payload` has passed its kind's schema when it was appended. */
export type TimelineEvent = { seq: number; kind: EventKind; payload: Record<string, unknown> };

export type AnswerSource = 'answer' | 'intake' | 'complaint' | 'test';

export type CurrentAnswer = {
	key: string;
	value: AnswerValue;
	/** The event that gave the answer. */
	seq: number;
	source: AnswerSource;
	/** The complaint's words behind an accepted match. */
	from?: string;
	/** The test whose result gave the answer. */
	test?: string;
};

export type DecidedMatch = { key: string; value: AnswerValue; accepted: boolean; seq: number };

export type CaseState = {
	answers: Map<string, CurrentAnswer>;
	notSure: Set<string>;
	/** Complaint matches the technician accepted or rejected, by observation key (latest kept). */
	decided: Map<string, DecidedMatch>;
	/** Ticked steps per test. */
	ticks: Map<string, Set<number>>;
};

const isAnswerValue = (value: unknown): value is AnswerValue =>
	typeof value === 'boolean' || typeof value === 'string' || typeof value === 'number';

const asString = (value: unknown): string | undefined =>
	typeof value === 'string' ? value : undefined;

function setAnswer(state: CaseState, answer: CurrentAnswer) {
	state.answers.set(answer.key, answer);
	state.notSure.delete(answer.key);
}

function applyOpened(state: CaseState, event: TimelineEvent) {
	const observations = event.payload.observations;
	if (observations && typeof observations === 'object') {
		for (const [key, value] of Object.entries(observations)) {
			if (isAnswerValue(value)) setAnswer(state, { key, value, seq: event.seq, source: 'intake' });
		}
	}
	const unknown = event.payload.unknown;
	if (Array.isArray(unknown)) {
		for (const key of unknown) if (typeof key === 'string') state.notSure.add(key);
	}
}

function applyMatch(state: CaseState, event: TimelineEvent, key: string, accepted: boolean) {
	const value = event.payload.value;
	if (!isAnswerValue(value)) return;
	state.decided.set(key, { key, value, accepted, seq: event.seq });
	if (accepted) {
		const from = asString(event.payload.from);
		setAnswer(state, { key, value, seq: event.seq, source: 'complaint', ...(from && { from }) });
	} else if (state.answers.get(key)?.source === 'complaint') {
		// Rejecting a match taken earlier withdraws the answer it gave.
		state.answers.delete(key);
	}
}

function applyTick(state: CaseState, event: TimelineEvent) {
	const test = asString(event.payload.test);
	const step = event.payload.step;
	if (!test || typeof step !== 'number') return;
	const steps = state.ticks.get(test) ?? new Set<number>();
	if (event.payload.done) steps.add(step);
	else steps.delete(step);
	state.ticks.set(test, steps);
}

/** Applies one event to the state (in place). Kinds that change no answer leave it as it was. */
export function applyEvent(state: CaseState, event: TimelineEvent): CaseState {
	const key = asString(event.payload.key);
	const value = event.payload.value;
	switch (event.kind) {
		case 'case_opened':
			applyOpened(state, event);
			break;
		case 'answer_set':
			if (key && isAnswerValue(value)) {
				setAnswer(state, { key, value, seq: event.seq, source: 'answer' });
			}
			break;
		case 'answer_cleared':
			if (key) {
				state.answers.delete(key);
				state.notSure.delete(key);
			}
			break;
		case 'not_sure':
			if (key) {
				state.answers.delete(key);
				state.notSure.add(key);
			}
			break;
		case 'complaint_match_accepted':
		case 'complaint_match_rejected':
			if (key) applyMatch(state, event, key, event.kind === 'complaint_match_accepted');
			break;
		case 'test_step_ticked':
			applyTick(state, event);
			break;
		case 'test_result_recorded': {
			const test = asString(event.payload.test);
			if (key && test && isAnswerValue(value)) {
				setAnswer(state, { key, value, seq: event.seq, source: 'test', test });
			}
			break;
		}
		default:
			// note, case_taken, rescored: part of the story, no change to the answers.
			break;
	}
	return state;
}

export const emptyCaseState = (): CaseState => ({
	answers: new Map(),
	notSure: new Set(),
	decided: new Map(),
	ticks: new Map()
});

/** The state after every event, applied in server order (by `seq`) whatever order they came in. */
export function deriveCaseState(events: readonly TimelineEvent[]): CaseState {
	const ordered = [...events].sort((a, b) => a.seq - b.seq);
	const state = emptyCaseState();
	for (const event of ordered) applyEvent(state, event);
	return state;
}

/**
 * What the diagnoser scores: the current answers and "not sure" keys, keeping only observations
 * the edition knows (a case rescored on a newer edition may hold answers it dropped).
 */
export function toDiagnoseInput(state: CaseState, isKnown: (key: string) => boolean = () => true) {
	const observations: Record<string, AnswerValue> = {};
	for (const answer of state.answers.values()) {
		if (isKnown(answer.key)) observations[answer.key] = answer.value;
	}
	const unknown = [...state.notSure].filter(isKnown);
	return { observations, unknown };
}

/** Keys the complaint's suggestions leave out: answered, "not sure", or already decided. */
export function settledKeys(state: CaseState): Set<string> {
	return new Set([...state.answers.keys(), ...state.notSure, ...state.decided.keys()]);
}

/** The state as JSON, kept on the case row so an append need not re-read the whole timeline. */
export type StoredCaseState = {
	v: 1;
	/** The last event the state includes. */
	seq: number;
	answers: CurrentAnswer[];
	notSure: string[];
	decided: DecidedMatch[];
	ticks: [string, number[]][];
};

export function storeCaseState(state: CaseState, seq: number): StoredCaseState {
	return {
		v: 1,
		seq,
		answers: [...state.answers.values()],
		notSure: [...state.notSure],
		decided: [...state.decided.values()],
		ticks: [...state.ticks].map(([test, steps]) => [test, [...steps]])
	};
}

/** The stored state if it is of this version and includes exactly the events up to `lastSeq`;
 * otherwise null, and the caller derives the state from the timeline. */
export function restoreCaseState(
	stored: StoredCaseState | null | undefined,
	lastSeq: number
): CaseState | null {
	if (!stored || stored.v !== 1 || stored.seq !== lastSeq) return null;
	return {
		answers: new Map(stored.answers.map((answer) => [answer.key, answer])),
		notSure: new Set(stored.notSure),
		decided: new Map(stored.decided.map((match) => [match.key, match])),
		ticks: new Map(stored.ticks.map(([test, steps]) => [test, new Set(steps)]))
	};
}
