// Phrase index: every phrase of an edition as weighted words, listed under its rarest content words.
import { compareKeys } from '../rank';
import type { Observation, ObservationValue, Rulebook } from '../schema';
import { isFunctionWord, stemWord, tokenize, weighWord } from './normalise';
import { isNegatedPhrase } from './polarity';
import type { WordReading } from './vocabulary';
import { CONJUNCTIONS, NEGATIONS } from './word-lists';

/** Share of the phrase (weighted) the complaint must cover. Keeps "fine on the motorway" from
 * matching "overheats on the motorway" on its little words, and a phrase from matching with one
 * of its few content words missing. */
export const MIN_PHRASE_COVERAGE = 0.75;

const NO_ENTRIES: readonly number[] = [];

export interface PhraseEntry {
	key: string;
	kind: Observation['kind'];
	value: ObservationValue;
	/** Phrase words without negations; the phrase's own negation is kept in `negated`. */
	words: string[];
	stems: string[];
	weights: number[];
	totalWeight: number;
	negated: boolean;
	/** Words that are neither little words nor conjunctions. */
	contentWordCount: number;
	conjunctions: Set<string>;
}

interface ContentWord {
	word: string;
	/** The weight the word carries in its phrase (summed when it appears twice). */
	weight: number;
}

export interface PhraseIndex {
	entries: PhraseEntry[];
	/** Content words of the phrases by stem. */
	wordsByStem: ReadonlyMap<string, string[]>;
	/** Each content word with the phrases (entry indices) that use it. */
	usersByWord: ReadonlyMap<string, { entryIndex: number; weight: number }[]>;
	/** Stems of every phrase word, little words included. */
	knownStems: ReadonlySet<string>;
	/** Per entry: its content words. */
	contentWords: ContentWord[][];
	/** Per entry: the content weight a segment must show for the phrase to reach its coverage
	 * (little words and conjunctions count as there). */
	neededWeights: number[];
	/** Phrases listed under their rarest content words only (prefix filtering). */
	prefixUsers: ReadonlyMap<string, number[]>;
	/** The content words numbered, and each entry's content words by number, so that the
	 * candidate check compares integers. */
	wordNumbers: ReadonlyMap<string, number>;
	contentWordNumbers: Int32Array[];
	contentWordWeights: Float64Array[];
	/** Marks `listCandidates` sets and clears again before it returns, kept here so that a
	 * complaint does not allocate them per segment (matching is synchronous, so no two calls
	 * share them at once). */
	scratch: { isKnownWord: Uint8Array; isTouchedEntry: Uint8Array };
}

export function buildPhraseIndex(rulebook: Rulebook): PhraseIndex {
	const entries = rulebook.observations.flatMap((observation) =>
		observation.phrases.flatMap((phrase) => {
			const entry = describePhrase(observation, phrase.text, phrase.value);
			return entry ? [entry] : [];
		})
	);
	const wordsByStem = new Map<string, string[]>();
	const usersByWord = new Map<string, { entryIndex: number; weight: number }[]>();
	const knownStems = new Set<string>();
	const contentWords: ContentWord[][] = entries.map(() => []);
	const neededWeights = entries.map((entry, entryIndex) => {
		let freeWeight = 0;
		entry.words.forEach((word, wordIndex) => {
			const stem = entry.stems[wordIndex];
			const weight = entry.weights[wordIndex];
			knownStems.add(stem);
			if (isFunctionWord(word)) {
				freeWeight += weight;
				return;
			}
			const sameStem = wordsByStem.get(stem) ?? [];
			if (!sameStem.includes(word)) sameStem.push(word);
			wordsByStem.set(stem, sameStem);
			const users = usersByWord.get(word) ?? [];
			const last = users[users.length - 1];
			if (last?.entryIndex === entryIndex) last.weight += weight;
			else users.push({ entryIndex, weight });
			usersByWord.set(word, users);
		});
		return MIN_PHRASE_COVERAGE * entry.totalWeight - 1e-9 - freeWeight;
	});
	for (const [word, users] of usersByWord) {
		for (const { entryIndex, weight } of users) contentWords[entryIndex].push({ word, weight });
	}
	const prefixUsers = listPrefixUsers(contentWords, neededWeights, usersByWord);
	const wordNumbers = new Map([...usersByWord.keys()].map((word, number) => [word, number]));
	return {
		entries,
		wordsByStem,
		usersByWord,
		knownStems,
		contentWords,
		neededWeights,
		prefixUsers,
		wordNumbers,
		contentWordNumbers: contentWords.map((words) =>
			Int32Array.from(words, ({ word }) => wordNumbers.get(word) as number)
		),
		contentWordWeights: contentWords.map((words) =>
			Float64Array.from(words, ({ weight }) => weight)
		),
		scratch: {
			isKnownWord: new Uint8Array(wordNumbers.size),
			isTouchedEntry: new Uint8Array(entries.length)
		}
	};
}

function describePhrase(
	observation: Observation,
	text: string,
	value: ObservationValue
): PhraseEntry | null {
	const tokens = tokenize(text).map((token) => token.word);
	const words = tokens.filter((word) => !NEGATIONS.has(word));
	if (words.length === 0) return null;
	const weights = words.map(weighWord);
	return {
		key: observation.key,
		kind: observation.kind,
		value,
		words,
		stems: words.map(stemWord),
		weights,
		totalWeight: weights.reduce((sum, weight) => sum + weight, 0),
		negated: isNegatedPhrase(tokens),
		contentWordCount: words.filter((word) => !isFunctionWord(word)).length,
		conjunctions: new Set(words.filter((word) => CONJUNCTIONS.has(word)))
	};
}

/**
 * Prefix filtering (as in set-similarity joins): a phrase can miss at most `allowance` of its
 * content weight and still reach its coverage, so a segment that matches it has at least one of
 * its rarest words worth more than that allowance. Phrases are therefore listed under those words
 * only, and common words ("coolant", "engine") no longer touch hundreds of phrases.
 */
function listPrefixUsers(
	contentWords: readonly ContentWord[][],
	neededWeights: readonly number[],
	usersByWord: PhraseIndex['usersByWord']
): Map<string, number[]> {
	const prefixUsers = new Map<string, number[]>();
	const rarity = (word: string) => usersByWord.get(word)?.length ?? 0;
	contentWords.forEach((words, entryIndex) => {
		const total = words.reduce((sum, { weight }) => sum + weight, 0);
		const allowance = total - neededWeights[entryIndex];
		const rarestFirst = [...words].sort(
			(a, b) => rarity(a.word) - rarity(b.word) || compareKeys(a.word, b.word)
		);
		let prefixWeight = 0;
		for (const { word, weight } of rarestFirst) {
			const users = prefixUsers.get(word);
			if (users) users.push(entryIndex);
			else prefixUsers.set(word, [entryIndex]);
			prefixWeight += weight;
			if (prefixWeight > allowance) break;
		}
	});
	return prefixUsers;
}

/** Phrases (entry indices, in order) that share words with the segment and could still reach
 * their coverage on the phrase words the segment's words may stand for. */
export function listCandidates(index: PhraseIndex, readings: readonly WordReading[]): number[] {
	const { isKnownWord, isTouchedEntry } = index.scratch;
	const known: number[] = [];
	const touched: number[] = [];
	for (const reading of readings) {
		for (const word of reading.fits.keys()) {
			const number = index.wordNumbers.get(word) as number;
			if (isKnownWord[number] === 1) continue;
			isKnownWord[number] = 1;
			known.push(number);
			for (const entryIndex of index.prefixUsers.get(word) ?? NO_ENTRIES) {
				if (isTouchedEntry[entryIndex] === 1) continue;
				isTouchedEntry[entryIndex] = 1;
				touched.push(entryIndex);
			}
		}
	}
	const candidates: number[] = [];
	for (const entryIndex of touched) {
		isTouchedEntry[entryIndex] = 0;
		const numbers = index.contentWordNumbers[entryIndex];
		const weights = index.contentWordWeights[entryIndex];
		let reached = 0;
		for (let word = 0; word < numbers.length; word++) {
			if (isKnownWord[numbers[word]] === 1) reached += weights[word];
		}
		if (reached >= index.neededWeights[entryIndex]) candidates.push(entryIndex);
	}
	for (const number of known) isKnownWord[number] = 0;
	return candidates.sort((a, b) => a - b);
}
