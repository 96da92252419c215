// Negation and doubt: whether a matched window is denied, doubted, or said outright.
import type { Segment } from './segments';
import { DOUBT_OPENERS, HEDGES, NEGATIONS, PAST_HABITS } from './word-lists';

/** A negation word reaches this many words ahead, within its clause. */
const NEGATION_REACH_WORDS = 3;

/** A negation word, unless it opens a doubt ("not sure", "no idea") or speaks of the past
 * ("never used to"). */
export function isNegationAt(words: readonly string[], index: number): boolean {
	const next = words[index + 1] ?? '';
	return NEGATIONS.has(words[index]) && !HEDGES.has(next) && !PAST_HABITS.has(next);
}

/** Whether a phrase's words deny what they name ("fan does not come on"). */
export function isNegatedPhrase(words: readonly string[]): boolean {
	return words.some((_, index) => isNegationAt(words, index));
}

export interface NegationReach {
	/** Index of the negation word that reaches the window, or null. */
	from: number | null;
	/** The window sits in a doubt ("not sure if …"): it says neither yes nor no. */
	doubtful: boolean;
}

/**
 * A negation inside the window, or up to a few words before it in the same clause. A doubt
 * earlier in the clause ("not sure if", "don't know whether") leaves the window unanswered.
 */
export function findNegation(segment: Segment, start: number, end: number): NegationReach {
	const { words, clauseStart } = segment;
	let doubting = false;
	for (let index = clauseStart[start]; index < start; index++) {
		if (NEGATIONS.has(words[index]) && HEDGES.has(words[index + 1] ?? '')) doubting = true;
		else if (doubting && DOUBT_OPENERS.has(words[index])) return { from: null, doubtful: true };
	}
	const from = Math.max(clauseStart[start], start - NEGATION_REACH_WORDS);
	for (let index = from; index < end; index++) {
		if (isNegationAt(words, index)) return { from: index, doubtful: false };
	}
	return { from: null, doubtful: false };
}
