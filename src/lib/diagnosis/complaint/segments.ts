// Segments of a complaint: stretches between punctuation, each with its clauses and stems.
import { stemWord, tokenize, type Token } from './normalise';
import { CONJUNCTIONS } from './word-lists';

export interface SegmentToken extends Token {
	stem: string;
}

export interface Segment {
	tokens: SegmentToken[];
	words: string[];
	tokenIndicesByStem: Map<string, number[]>;
	/** Index of the first token of the clause each token belongs to (clauses end at and/but). */
	clauseStart: number[];
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
		if (tokens.length > 0) segments.push(describeSegment(tokens));
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
	return { tokens, words: tokens.map((token) => token.word), tokenIndicesByStem, clauseStart };
}
