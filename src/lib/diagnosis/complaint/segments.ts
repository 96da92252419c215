// Segments of a complaint: stretches between punctuation, each with its clauses and stems.
import { stemWord, tokenize, type Token } from './normalise';
import { CONJUNCTIONS, DOUBT_WORDS, HEDGES, LITTLE_WORDS, NEGATIONS } from './word-lists';

export interface SegmentToken extends Token {
	stem: string;
}

export interface Segment {
	tokens: SegmentToken[];
	words: string[];
	tokenIndicesByStem: Map<string, number[]>;
	/** Index of the first token of the clause each token belongs to (clauses end at and/but). */
	clauseStart: number[];
	/** The next segment is a doubt on its own ("…, maybe", "…, not sure", "…, I think"). */
	doubtedAfter: boolean;
}

/** Stretches between punctuation (a decimal point is no break); inside each, clauses start after
 * a conjunction. */
export function splitSegments(text: string): Segment[] {
	const segments: Segment[] = [];
	for (const part of text.matchAll(/(?:[^.,;:!?()\n\r]|\.(?=\d))+/g)) {
		const offset = part.index;
		const tokens = tokenize(part[0]).map((token) => ({
			word: token.word,
			stem: stemWord(token.word),
			start: token.start + offset,
			end: token.end + offset
		}));
		if (tokens.length === 0) continue;
		const previous = segments[segments.length - 1];
		if (previous && isDoubtOnly(tokens)) previous.doubtedAfter = true;
		segments.push(describeSegment(tokens));
	}
	return segments;
}

function describeSegment(tokens: SegmentToken[]): Segment {
	const clauseStart: number[] = [];
	const tokenIndicesByStem = new Map<string, number[]>();
	let start = 0;
	tokens.forEach((token, index) => {
		if (CONJUNCTIONS.has(token.word)) start = index + 1;
		clauseStart.push(start);
		const sameStem = tokenIndicesByStem.get(token.stem);
		if (sameStem) sameStem.push(index);
		else tokenIndicesByStem.set(token.stem, [index]);
	});
	return {
		tokens,
		words: tokens.map((token) => token.word),
		tokenIndicesByStem,
		clauseStart,
		doubtedAfter: false
	};
}

/** "maybe", "not sure", "I'm not certain", "I think": words of doubt and little words only. */
function isDoubtOnly(tokens: readonly SegmentToken[]): boolean {
	const words = tokens.map((token) => token.word);
	const doubts = words.filter(
		(word, index) =>
			DOUBT_WORDS.has(word) || (HEDGES.has(word) && NEGATIONS.has(words[index - 1] ?? ''))
	);
	return (
		doubts.length > 0 &&
		words.every(
			(word) =>
				DOUBT_WORDS.has(word) || HEDGES.has(word) || NEGATIONS.has(word) || LITTLE_WORDS.has(word)
		)
	);
}
