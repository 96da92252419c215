// Negation and doubt: whether a matched window is denied, doubted, or said outright.
import type { Segment } from './segments';
import {
	DOUBT_OPENERS,
	DOUBT_WORDS,
	HEDGES,
	NEGATIONS,
	PARTIAL_WORDS,
	PAST_HABITS
} from './word-lists';

/** A negation word reaches this many words ahead, within its clause. */
const NEGATION_REACH_WORDS = 3;
/** A word of doubt reaches this many words ahead, and this many back, within its clause. */
const DOUBT_REACH_WORDS = 5;
const DOUBT_TRAIL_WORDS = 2;
/** A late or weak word reaches back this many words over the end of a yes reading. */
const PARTIAL_REACH_WORDS = 4;

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
 * A negation inside the window, or up to a few words before it in the same clause. A doubt in
 * the clause ("not sure if", "don't know whether", "I think", "maybe") or a segment of doubt
 * just after it ("…, not sure") leaves the window unanswered.
 */
export function findNegation(segment: Segment, start: number, end: number): NegationReach {
	const { words, clauseStart } = segment;
	if (segment.doubtedAfter || hasDoubtWord(segment, start, end)) {
		return { from: null, doubtful: true };
	}
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

/** Whether a word of doubt in the window's clause reaches it: a few words before it ("I think
 * the fan comes on"), inside it, or just after it ("the fan comes on I think"). */
function hasDoubtWord(segment: Segment, start: number, end: number): boolean {
	const { words, clauseStart } = segment;
	const first = Math.max(clauseStart[start], start - DOUBT_REACH_WORDS);
	const last = Math.min(words.length, end + DOUBT_TRAIL_WORDS);
	for (let index = first; index < last; index++) {
		if (clauseStart[index] !== clauseStart[start]) break;
		if (DOUBT_WORDS.has(words[index])) return true;
	}
	return false;
}

/** Whether a late or weak word ("comes on late", "is slow to come on", "only comes on when it's
 * already boiling") sits inside the window or a few words after it, in its clause, and is not
 * one of the phrase's own words. Such a yes is a partial finding, no plain yes. */
export function isPartialReading(
	segment: Segment,
	start: number,
	end: number,
	phraseWords: readonly string[]
): boolean {
	const { words, clauseStart } = segment;
	const last = Math.min(words.length, end + PARTIAL_REACH_WORDS);
	for (let index = start; index < last; index++) {
		if (clauseStart[index] !== clauseStart[start]) break;
		const partial =
			PARTIAL_WORDS.has(words[index]) || (words[index] === 'slow' && words[index + 1] === 'to');
		if (partial && !phraseWords.includes(words[index])) return true;
	}
	return false;
}
