// Fuzzy vocabulary: each complaint word read as the phrase words it may stand for (fuse.js for typos).
import Fuse from 'fuse.js';
import { isFunctionWord, stemWord } from './normalise';
import type { PhraseIndex } from './phrase-index';
import { NEGATIONS } from './word-lists';

/** For one complaint word: the phrase content words it may stand for, with their similarity. */
export interface WordReading {
	fits: ReadonlyMap<string, number>;
	/** Read as a misspelling of phrase words (not by its own stem). */
	misspelt: boolean;
}

/** A phrase word may be a loose match (typo); a match below this counts as none. */
const MIN_WORD_SIMILARITY = 0.8;
/** Shorter words must match exactly (or by ending): one letter changes too much of them. */
const MIN_FUZZY_WORD_LENGTH = 4;
/** Highest fuse.js score (errors per letter of the word) a misspelling may have. */
const FUSE_THRESHOLD = 0.3;
/** Readings of words the phrases do not use are kept per edition, up to this many. */
const MAX_CACHED_READINGS = 10_000;

const NO_READING: WordReading = { fits: new Map(), misspelt: false };

export interface Vocabulary {
	/** A word read by its stem stands for every phrase word of that stem, fully. */
	readingsByStem: ReadonlyMap<string, WordReading>;
	/** Stems of every phrase word, little words included. */
	knownStems: ReadonlySet<string>;
	fuse: Fuse<string>;
	/** Readings of misspelt and unknown words already searched (bounded). */
	cache: Map<string, WordReading>;
}

export function buildVocabulary(index: PhraseIndex): Vocabulary {
	const readingsByStem = new Map<string, WordReading>(
		[...index.wordsByStem].map(([stem, words]) => [
			stem,
			{ fits: new Map(words.map((known) => [known, 1])), misspelt: false }
		])
	);
	const fuzzyWords = [...index.usersByWord.keys()].filter(
		(word) => word.length >= MIN_FUZZY_WORD_LENGTH
	);
	// Without the field-length norm, a result's score is the Bitap errors over the word's length.
	const fuse = new Fuse(fuzzyWords, {
		includeScore: true,
		ignoreLocation: true,
		ignoreFieldNorm: true,
		threshold: FUSE_THRESHOLD
	});
	return { readingsByStem, knownStems: index.knownStems, fuse, cache: new Map() };
}

/** A word the phrases know is taken as meant, so "dripping" never reads as "dropping"; another
 * word of four letters or more is read as the phrase words fuse.js finds close to it. */
export function readWord(vocabulary: Vocabulary, word: string): WordReading {
	if (NEGATIONS.has(word) || isFunctionWord(word)) return NO_READING;
	const stem = stemWord(word);
	const sameStem = vocabulary.readingsByStem.get(stem);
	if (sameStem) return sameStem;
	if (vocabulary.knownStems.has(stem) || word.length < MIN_FUZZY_WORD_LENGTH) return NO_READING;
	const cached = vocabulary.cache.get(word);
	if (cached) return cached;
	const fits = new Map<string, number>();
	for (const [known, similarity] of searchVocabulary(vocabulary.fuse, word)) {
		if (similarity >= MIN_WORD_SIMILARITY) fits.set(known, similarity);
	}
	const reading = fits.size > 0 ? { fits, misspelt: true } : NO_READING;
	if (vocabulary.cache.size >= MAX_CACHED_READINGS) vocabulary.cache.clear();
	vocabulary.cache.set(word, reading);
	return reading;
}

/** The phrase words fuse.js finds close to `word`, with how alike they are (0..1). fuse.js finds
 * the word inside a longer one as well, so a difference in length counts as errors too ("cool"
 * is not "coolant"). */
function searchVocabulary(fuse: Fuse<string>, word: string): [string, number][] {
	return fuse.search(word).map((result) => {
		const known = result.item;
		const errors = Math.max(
			Math.round((result.score ?? 1) * word.length),
			Math.abs(known.length - word.length)
		);
		return [known, 1 - errors / Math.max(word.length, known.length)];
	});
}
