// Normalise and stem: a complaint or phrase as lower-case words with offsets into what was written.
import {
	CONJUNCTIONS,
	IRREGULAR_VERBS,
	LITTLE_WORDS,
	LITTLE_WORD_WEIGHT,
	MISSPELT_NEGATED_VERBS,
	NEGATED_VERBS_WITHOUT_APOSTROPHE,
	VERBS_BEFORE_NT
} from './word-lists';

export interface Token {
	word: string;
	/** Offsets of the word in the text it came from. */
	start: number;
	end: number;
}

const QUOTE_MARKS = /[\u2018\u2019`]/;
const QUOTE_MARKS_ALL = /[\u2018\u2019`]/g;

/** Words of `text`, lower-case; a contraction "doesn't" becomes "does" and "not", both quoting
 * the whole contraction. Offsets point into `text` as written. */
export function tokenize(text: string): Token[] {
	const tokens: Token[] = [];
	for (const match of text.matchAll(/[a-z0-9]+(?:['\u2018\u2019`][a-z]+)?/gi)) {
		const start = match.index;
		const end = start + match[0].length;
		const lower = match[0].toLowerCase();
		const word = QUOTE_MARKS.test(lower) ? lower.replace(QUOTE_MARKS_ALL, "'") : lower;
		const apostrophe = word.indexOf("'");
		const negatedVerb = readNegatedVerb(word);
		if (negatedVerb !== undefined) {
			if (negatedVerb) tokens.push({ word: negatedVerb, start, end });
			tokens.push({ word: 'not', start, end });
		} else if (apostrophe > 0) {
			// "engine's", "it's", "i've": the word itself; the clitic adds nothing to match on.
			tokens.push({ word: word.slice(0, apostrophe), start, end });
		} else {
			tokens.push({ word, start, end });
		}
	}
	return tokens;
}

/** The verb of a negated contraction ("doesn't", "doesnt", "does'nt", "dosent"), "" for a bare
 * "n't", or undefined when the word is none. */
function readNegatedVerb(word: string): string | undefined {
	if (word.endsWith("n't")) return VERBS_BEFORE_NT.get(word.slice(0, -3)) ?? word.slice(0, -3);
	if (word.endsWith("'nt")) return word.slice(0, -3);
	return NEGATED_VERBS_WITHOUT_APOSTROPHE.get(word) ?? MISSPELT_NEGATED_VERBS.get(word);
}

/**
 * A light stemmer, the same for phrases and complaints: plural, -ing and -ed endings, a doubled
 * final consonant on a longer word ("dripping", but "topping" stays apart from "top"), an
 * adjective -y, irregular past tenses ("came" for "come"), a silent final e ("hose"/"hoses", "idle"/"idling") and British -ise against
 * American -ize.
 */
export function stemWord(word: string): string {
	let stem = IRREGULAR_VERBS.get(word) ?? word;
	let cutVerbEnding = false;
	if (stem.length > 4 && (stem.endsWith('ies') || stem.endsWith('ied'))) {
		stem = `${stem.slice(0, -3)}y`;
	} else if (stem.length > 3 && stem.endsWith('oes')) {
		stem = stem.slice(0, -2);
	} else if (stem.length >= 6 && stem.endsWith('ing')) {
		stem = stem.slice(0, -3);
		cutVerbEnding = true;
	} else if (stem.length >= 5 && stem.endsWith('ed') && !stem.endsWith('eed')) {
		stem = stem.slice(0, -2);
		cutVerbEnding = true;
	} else if (stem.length >= 4 && stem.endsWith('s') && !/(?:ss|us|is)$/.test(stem)) {
		stem = stem.slice(0, -1);
	}
	// "crusty", "leaky", "sludgy" stand for the noun.
	if (stem.length >= 5 && /[^aeiou]y$/.test(stem)) stem = stem.slice(0, -1);
	if (cutVerbEnding && stem.length >= 5 && /([^aeiouylszf])\1$/.test(stem)) {
		stem = stem.slice(0, -1);
	}
	if (stem.length >= 4 && stem.endsWith('e')) stem = stem.slice(0, -1);
	if (stem.length >= 6 && stem.endsWith('is')) stem = `${stem.slice(0, -2)}iz`;
	return stem;
}

export function isLittleWord(word: string): boolean {
	return LITTLE_WORDS.has(word);
}

/** Little words and conjunctions: they carry no meaning of their own to match on. */
export function isFunctionWord(word: string): boolean {
	return LITTLE_WORDS.has(word) || CONJUNCTIONS.has(word);
}

export function weighWord(word: string): number {
	return LITTLE_WORDS.has(word) ? LITTLE_WORD_WEIGHT : 1;
}
