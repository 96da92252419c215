import Fuse from 'fuse.js';
import type { Observation, ObservationValue, Rulebook } from './schema';

export interface ComplaintMatch {
	key: string;
	value: ObservationValue;
	/** The part of the complaint, as written, that gave the match. */
	from: string;
	/** 0..1, 1 = the phrase exactly. Full precision until a response is built. */
	score: number;
}

/** A phrase word may be a loose match (typo); a match below this counts as none. */
const MIN_WORD_SIMILARITY = 0.8;
/** Shorter words must match exactly (or by ending): one letter changes too much of them. */
const MIN_FUZZY_WORD_LENGTH = 4;
/** Share of the phrase (weighted) the complaint must cover. Keeps "fine on the motorway" from
 * matching "overheats on the motorway" on its little words, and a phrase from matching with one
 * of its few content words missing. */
const MIN_PHRASE_COVERAGE = 0.75;
const MIN_SCORE = 0.75;
/** A window may be this many words longer than the phrase it is compared with. */
const EXTRA_WINDOW_WORDS = 3;
/** A negation word reaches this many words ahead, within its clause. */
const NEGATION_REACH_WORDS = 3;
const MAX_COMPLAINT_CHARS = 2000;

const NEGATIONS = new Set([
	'no',
	'not',
	'never',
	'without',
	'nor',
	"doesn't",
	'doesnt',
	"isn't",
	'isnt',
	"don't",
	'dont',
	"didn't",
	'didnt',
	"wasn't",
	'wasnt',
	"won't",
	'wont',
	"hasn't",
	'hasnt',
	"haven't",
	'havent',
	"can't",
	'cant',
	"aren't",
	'arent',
	"hadn't",
	'hadnt'
]);
const CONJUNCTIONS = new Set(['and', 'but', 'although', 'though', 'however', 'whereas']);
// Little words count for a quarter: they may differ without changing what was said.
const LITTLE_WORDS = new Set([
	'a',
	'an',
	'the',
	'in',
	'on',
	'at',
	'of',
	'to',
	'up',
	'it',
	'its',
	"it's",
	'is',
	'was',
	'are',
	'be',
	'been',
	'my',
	'i',
	'me',
	'we',
	'our',
	'out',
	'when',
	'from',
	'with',
	'for',
	'this',
	'that',
	'there',
	'some',
	'any',
	'all',
	'just',
	'very',
	'really',
	'got',
	'get',
	'gets',
	'keeps',
	'still'
]);
const LITTLE_WORD_WEIGHT = 0.25;

interface Token {
	word: string;
	start: number;
	end: number;
}

function tokenize(text: string): Token[] {
	const tokens: Token[] = [];
	// Matched on the original text so that offsets point into what the customer wrote.
	for (const match of text.matchAll(/[a-z0-9]+(?:['\u2018\u2019`][a-z]+)?/gi)) {
		tokens.push({
			word: match[0].toLowerCase().replace(/[\u2018\u2019`]/g, "'"),
			start: match.index,
			end: match.index + match[0].length
		});
	}
	return tokens;
}

function stemWord(word: string): string {
	for (const suffix of ['ing', 'ed', 'es', 's']) {
		if (word.length - suffix.length >= 3 && word.endsWith(suffix)) {
			return word.slice(0, -suffix.length);
		}
	}
	return word;
}

function measureEditDistance(a: string, b: string): number {
	let previous = Array.from({ length: b.length + 1 }, (_, index) => index);
	for (let i = 1; i <= a.length; i++) {
		const current = [i];
		for (let j = 1; j <= b.length; j++) {
			const cost = a[i - 1] === b[j - 1] ? 0 : 1;
			current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
		}
		previous = current;
	}
	return previous[b.length];
}

function measureTypoSimilarity(a: string, b: string): number {
	return 1 - measureEditDistance(a, b) / Math.max(a.length, b.length);
}

function weighWord(word: string): number {
	return LITTLE_WORDS.has(word) ? LITTLE_WORD_WEIGHT : 1;
}

interface PhraseEntry {
	key: string;
	kind: Observation['kind'];
	value: ObservationValue;
	/** Phrase words without negations; the phrase's own negation is kept in `negated`. */
	words: string[];
	stems: string[];
	weights: number[];
	totalWeight: number;
	negated: boolean;
	conjunctions: Set<string>;
}

/** For one complaint word: the phrase content words it may stand for, with their similarity. */
type WordReading = ReadonlyMap<string, number>;
const NO_READING: WordReading = new Map();
/** Readings of words the phrases do not use are kept per edition, up to this many. */
const MAX_CACHED_READINGS = 10_000;

export interface ComplaintMatcher {
	matchComplaint(complaint: string, skip?: ReadonlySet<string>): ComplaintMatch[];
}

/**
 * Built once per edition. Each complaint word is read as the phrase words it stands for: the
 * same word or stem, or, for a word the phrases do not use, a close misspelling found by fuse.js
 * over the phrases' vocabulary ("trafic" for "traffic"). A word the phrases know is taken as
 * meant, so "dripping" never reads as "dropping". Phrases that share a content word with a
 * stretch of the complaint are then scored on word windows of that stretch, by weighted word
 * overlap that favours covering the whole phrase.
 */
export function buildComplaintMatcher(rulebook: Rulebook): ComplaintMatcher {
	const entries: PhraseEntry[] = [];
	for (const observation of rulebook.observations) {
		for (const phrase of observation.phrases) {
			const tokens = tokenize(phrase.text).map((token) => token.word);
			const words = tokens.filter((word) => !NEGATIONS.has(word));
			if (words.length === 0) continue;
			const weights = words.map(weighWord);
			entries.push({
				key: observation.key,
				kind: observation.kind,
				value: phrase.value,
				words,
				stems: words.map(stemWord),
				weights,
				totalWeight: weights.reduce((sum, weight) => sum + weight, 0),
				negated: tokens.some((word) => NEGATIONS.has(word)),
				conjunctions: new Set(words.filter((word) => CONJUNCTIONS.has(word)))
			});
		}
	}

	// Content words of the phrases, by stem, and the phrases that use each.
	const wordsByStem = new Map<string, string[]>();
	const entriesByWord = new Map<string, number[]>();
	const knownStems = new Set<string>();
	entries.forEach((entry, entryIndex) => {
		entry.words.forEach((word, wordIndex) => {
			knownStems.add(entry.stems[wordIndex]);
			if (LITTLE_WORDS.has(word) || CONJUNCTIONS.has(word)) return;
			const stem = entry.stems[wordIndex];
			const sameStem = wordsByStem.get(stem) ?? [];
			if (!sameStem.includes(word)) sameStem.push(word);
			wordsByStem.set(stem, sameStem);
			const users = entriesByWord.get(word) ?? [];
			if (users[users.length - 1] !== entryIndex) users.push(entryIndex);
			entriesByWord.set(word, users);
		});
	});
	const vocabulary = new Fuse([...entriesByWord.keys()], {
		includeScore: true,
		ignoreLocation: true,
		threshold: 0.35
	});
	const cachedReadings = new Map<string, WordReading>();

	function readWord(word: string): WordReading {
		if (NEGATIONS.has(word) || CONJUNCTIONS.has(word) || LITTLE_WORDS.has(word)) return NO_READING;
		const stem = stemWord(word);
		const sameStem = wordsByStem.get(stem);
		if (sameStem) return new Map(sameStem.map((known) => [known, 1]));
		if (knownStems.has(stem) || word.length < MIN_FUZZY_WORD_LENGTH) return NO_READING;
		const cached = cachedReadings.get(word);
		if (cached) return cached;
		const reading = new Map<string, number>();
		for (const result of vocabulary.search(word)) {
			const known = result.item;
			if (known.length < MIN_FUZZY_WORD_LENGTH) continue;
			const similarity = measureTypoSimilarity(word, known);
			if (similarity >= MIN_WORD_SIMILARITY) reading.set(known, similarity);
		}
		if (cachedReadings.size >= MAX_CACHED_READINGS) cachedReadings.clear();
		cachedReadings.set(word, reading);
		return reading;
	}

	return {
		matchComplaint(complaint, skip = new Set()) {
			const text = complaint.slice(0, MAX_COMPLAINT_CHARS);
			const best = new Map<string, ComplaintMatch & { position: number }>();
			const readings = new Map<string, WordReading>();
			const readCached = (word: string) => {
				let reading = readings.get(word);
				if (!reading) {
					reading = readWord(word);
					readings.set(word, reading);
				}
				return reading;
			};
			for (const segment of splitSegments(text)) {
				const segmentReadings = segment.tokens.map((token) => readCached(token.word));
				// Tokens read as a misspelling of some other phrase word (not by their own stem).
				const typoTokenIndices = segment.tokens.flatMap((token, index) =>
					[...segmentReadings[index].keys()].some((known) => stemWord(known) !== token.stem)
						? [index]
						: []
				);
				const candidates = new Set<number>();
				for (const reading of segmentReadings) {
					for (const known of reading.keys()) {
						for (const entryIndex of entriesByWord.get(known) ?? []) candidates.add(entryIndex);
					}
				}
				for (const entryIndex of [...candidates].sort((a, b) => a - b)) {
					const entry = entries[entryIndex];
					if (skip.has(entry.key)) continue;
					const found = findBestWindow(entry, segment, segmentReadings, typoTokenIndices);
					if (!found) continue;
					const windowNegated = found.negatedFrom !== null;
					let value = entry.value;
					if (windowNegated !== entry.negated) {
						// A negated enum phrase says what it is not, which picks no value.
						if (entry.kind !== 'boolean') continue;
						value = !value;
					}
					const startToken =
						segment.tokens[Math.min(found.negatedFrom ?? found.start, found.start)];
					const endToken = segment.tokens[found.end - 1];
					const match = {
						key: entry.key,
						value,
						from: text.slice(startToken.start, endToken.end),
						score: found.score,
						position: startToken.start
					};
					const current = best.get(entry.key);
					if (
						!current ||
						match.score > current.score ||
						(match.score === current.score && match.position < current.position)
					) {
						best.set(entry.key, match);
					}
				}
			}
			return [...best.values()]
				.sort((a, b) => a.position - b.position || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
				.map(({ key, value, from, score }) => ({ key, value, from, score }));
		}
	};
}

interface SegmentToken extends Token {
	stem: string;
}

interface Segment {
	tokens: SegmentToken[];
	tokenIndicesByStem: Map<string, number[]>;
	/** Index of the first token of the clause each token belongs to (clauses end at and/but). */
	clauseStart: number[];
}

/** Stretches between punctuation; inside each, clauses start after a conjunction. */
function splitSegments(text: string): Segment[] {
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
		segments.push({ tokens, tokenIndicesByStem, clauseStart });
	}
	return segments;
}

interface WindowMatch {
	start: number;
	end: number;
	score: number;
	/** Index of the negation word that reaches this window, or null. */
	negatedFrom: number | null;
}

/** How well complaint token `token` stands for phrase word `wordIndex` of `entry` (0..1). */
function measureTokenFit(
	entry: PhraseEntry,
	wordIndex: number,
	token: SegmentToken,
	reading: WordReading
): number {
	if (token.stem === entry.stems[wordIndex]) return 1;
	return reading.size === 0 ? 0 : (reading.get(entry.words[wordIndex]) ?? 0);
}

/**
 * The best-scoring window of the segment for this phrase. Windows start and end on tokens that
 * fit some phrase word: a window edge on a word the phrase lacks only lowers the score.
 */
function findBestWindow(
	entry: PhraseEntry,
	segment: Segment,
	readings: WordReading[],
	typoTokenIndices: readonly number[]
): WindowMatch | null {
	// Most candidates share one common word with the segment: skip those that could not reach the
	// coverage even if every little word of theirs were there too.
	let reachableWeight = 0;
	entry.words.forEach((word, wordIndex) => {
		if (
			LITTLE_WORDS.has(word) ||
			segment.tokenIndicesByStem.has(entry.stems[wordIndex]) ||
			typoTokenIndices.some((index) => readings[index].has(word))
		) {
			reachableWeight += entry.weights[wordIndex];
		}
	});
	if (reachableWeight < MIN_PHRASE_COVERAGE * entry.totalWeight) return null;
	const anchorSet = new Set<number>();
	for (const stem of entry.stems) {
		for (const index of segment.tokenIndicesByStem.get(stem) ?? []) anchorSet.add(index);
	}
	for (const index of typoTokenIndices) {
		if (entry.words.some((word) => readings[index].has(word))) anchorSet.add(index);
	}
	const anchors = [...anchorSet]
		.filter((index) => !NEGATIONS.has(segment.tokens[index].word))
		.sort((a, b) => a - b);
	const maxLength = entry.words.length + EXTRA_WINDOW_WORDS;
	let best: WindowMatch | null = null;
	for (let first = 0; first < anchors.length; first++) {
		const start = anchors[first];
		for (let last = first; last < anchors.length; last++) {
			const end = anchors[last] + 1;
			if (end - start > maxLength) break;
			const score = scoreWindow(entry, segment, start, end, readings);
			if (score === null || (best && score <= best.score)) continue;
			best = { start, end, score, negatedFrom: findNegation(segment, start, end) };
		}
	}
	return best;
}

/** Recall-weighted F-score (β = 2) of phrase words found in the window, or null if too weak. */
function scoreWindow(
	entry: PhraseEntry,
	segment: Segment,
	start: number,
	end: number,
	readings: WordReading[]
): number | null {
	const used = new Uint8Array(end - start);
	let windowWeight = 0;
	for (let index = start; index < end; index++) {
		const word = segment.tokens[index].word;
		if (CONJUNCTIONS.has(word) && !entry.conjunctions.has(word)) return null;
		if (NEGATIONS.has(word)) used[index - start] = 1;
		else windowWeight += weighWord(word);
	}
	let matchedWeight = 0;
	for (let wordIndex = 0; wordIndex < entry.words.length; wordIndex++) {
		let bestFit = 0;
		let bestAt = -1;
		for (let index = start; index < end; index++) {
			if (used[index - start]) continue;
			const fit = measureTokenFit(entry, wordIndex, segment.tokens[index], readings[index]);
			if (fit > bestFit) {
				bestFit = fit;
				bestAt = index;
				if (fit === 1) break;
			}
		}
		if (bestAt >= 0) {
			used[bestAt - start] = 1;
			matchedWeight += bestFit * entry.weights[wordIndex];
		}
	}
	if (windowWeight === 0) return null;
	const recall = matchedWeight / entry.totalWeight;
	const precision = matchedWeight / windowWeight;
	if (recall < MIN_PHRASE_COVERAGE || precision === 0) return null;
	const score = (5 * precision * recall) / (4 * precision + recall);
	return score >= MIN_SCORE ? Math.min(1, score) : null;
}

/** A negation inside the window, or up to a few words before it in the same clause. */
function findNegation(segment: Segment, start: number, end: number): number | null {
	const { tokens, clauseStart } = segment;
	const from = Math.max(clauseStart[start], start - NEGATION_REACH_WORDS);
	for (let index = from; index < end; index++) {
		if (NEGATIONS.has(tokens[index].word)) return index;
	}
	return null;
}
