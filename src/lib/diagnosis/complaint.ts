// Complaint matching: reads a customer's free text as answers to the rulebook's observations.
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
/** Score lost per pair of content words said in the other order: "reservoir is cracked" still
 * reads as "cracked reservoir", but "coolant in the oil" reads closer to its own phrase than to
 * "oil in the coolant". */
const ORDER_PENALTY = 0.04;
/** A longer match of another observation may be this much weaker and still explain a match
 * whose words it contains. */
const SUBSUMING_SCORE_SLACK = 0.1;
/** Matches of two observations sharing this many content words are rival readings. */
const MIN_SHARED_WORDS_FOR_RIVALS = 2;

const NEGATIONS = new Set(['no', 'not', 'never', 'without', 'nor', 'none', 'nothing', 'neither']);
/** "doesn't", "cant": the verb and a separate "not", so "fan doesn't come on" meets the phrase
 * "fan does not come on". Customers often leave the apostrophe out. */
const VERBS_BEFORE_NT = new Map([
	['ca', 'can'],
	['wo', 'will'],
	['ai', 'is'],
	['sha', 'shall']
]);
const NEGATED_VERBS_WITHOUT_APOSTROPHE = new Map([
	['doesnt', 'does'],
	['dont', 'do'],
	['didnt', 'did'],
	['isnt', 'is'],
	['arent', 'are'],
	['wasnt', 'was'],
	['werent', 'were'],
	['wont', 'will'],
	['cant', 'can'],
	['cannot', 'can'],
	['couldnt', 'could'],
	['wouldnt', 'would'],
	['shouldnt', 'should'],
	['hasnt', 'has'],
	['havent', 'have'],
	['hadnt', 'had'],
	['aint', 'is']
]);
/** After a negation these make it a doubt, not a denial: "not sure if the fan comes on". */
const HEDGES = new Set(['sure', 'certain', 'know', 'idea', 'clue', 'remember']);
/** After a negation this speaks of the past, which denies nothing now: "it never used to". */
const PAST_HABITS = new Set(['used']);
/** A doubt reaches a phrase only through one of these: "don't know if …" (but "can't tell where
 * it is leaking from" is a statement). */
const DOUBT_OPENERS = new Set(['if', 'whether']);
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
	'still',
	'do',
	'does',
	'did',
	'has',
	'have',
	'had',
	'will',
	'would',
	'can',
	'could',
	'should',
	'am',
	'were',
	'being',
	'under',
	'into',
	'onto',
	'by',
	'as',
	'also',
	'even',
	'if',
	'they',
	'you',
	'your',
	'he',
	'she',
	'his',
	'her',
	'them',
	'which'
]);
const LITTLE_WORD_WEIGHT = 0.25;

interface Token {
	word: string;
	start: number;
	end: number;
}

const NO_NUMBERS: readonly number[] = [];
const QUOTE_MARKS = /[\u2018\u2019`]/;
const QUOTE_MARKS_ALL = /[\u2018\u2019`]/g;

function tokenize(text: string): Token[] {
	const tokens: Token[] = [];
	// Matched on the original text so that offsets point into what the customer wrote.
	for (const match of text.matchAll(/[a-z0-9]+(?:['\u2018\u2019`][a-z]+)?/gi)) {
		const start = match.index;
		const end = start + match[0].length;
		const lower = match[0].toLowerCase();
		const word = QUOTE_MARKS.test(lower) ? lower.replace(QUOTE_MARKS_ALL, "'") : lower;
		const apostrophe = word.indexOf("'");
		const negatedVerb = word.endsWith("n't")
			? (VERBS_BEFORE_NT.get(word.slice(0, -3)) ?? word.slice(0, -3))
			: NEGATED_VERBS_WITHOUT_APOSTROPHE.get(word);
		if (negatedVerb !== undefined) {
			// Both halves quote the whole contraction.
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

/**
 * A light stemmer, the same for phrases and complaints: plural, -ing and -ed endings, a doubled
 * final consonant on a longer word ("dripping", but "topping" stays apart from "top"), an
 * adjective -y, a silent final e ("hose"/"hoses", "idle"/"idling") and British -ise against
 * American -ize.
 */
function stemWord(word: string): string {
	let stem = word;
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
	/** Words that are neither little words nor conjunctions. */
	contentWordCount: number;
	conjunctions: Set<string>;
}

/** For one complaint word: the phrase content words it may stand for, with their similarity. */
type WordReading = ReadonlyMap<string, number>;
const NO_READING: WordReading = new Map();
/** Readings of words the phrases do not use are kept per edition, up to this many. */
const MAX_CACHED_READINGS = 10_000;
/** Highest fuse.js score (errors per letter of the word) a misspelling may have. */
const FUSE_THRESHOLD = 0.3;

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
			const negated = tokens.some((_, index) => isNegationAt(tokens, index));
			const weights = words.map(weighWord);
			entries.push({
				key: observation.key,
				kind: observation.kind,
				value: phrase.value,
				words,
				stems: words.map(stemWord),
				weights,
				totalWeight: weights.reduce((sum, weight) => sum + weight, 0),
				negated,
				contentWordCount: words.filter((word) => !LITTLE_WORDS.has(word) && !CONJUNCTIONS.has(word))
					.length,
				conjunctions: new Set(words.filter((word) => CONJUNCTIONS.has(word)))
			});
		}
	}

	// Content words of the phrases, by stem, and the phrases that use each (with the weight the
	// word carries in that phrase). Little words and conjunctions of a phrase count as always
	// there when deciding whether it could reach its coverage.
	const wordsByStem = new Map<string, string[]>();
	const usersByWord = new Map<string, { entryIndex: number; weight: number }[]>();
	const knownStems = new Set<string>();
	const freeWeights = new Float64Array(entries.length);
	entries.forEach((entry, entryIndex) => {
		entry.words.forEach((word, wordIndex) => {
			knownStems.add(entry.stems[wordIndex]);
			if (LITTLE_WORDS.has(word) || CONJUNCTIONS.has(word)) {
				freeWeights[entryIndex] += entry.weights[wordIndex];
				return;
			}
			const stem = entry.stems[wordIndex];
			const sameStem = wordsByStem.get(stem) ?? [];
			if (!sameStem.includes(word)) sameStem.push(word);
			wordsByStem.set(stem, sameStem);
			const users = usersByWord.get(word) ?? [];
			const last = users[users.length - 1];
			if (last?.entryIndex === entryIndex) last.weight += entry.weights[wordIndex];
			else users.push({ entryIndex, weight: entry.weights[wordIndex] });
			usersByWord.set(word, users);
		});
	});
	// A word read by its stem stands for every phrase word of that stem, fully.
	const readingsByStem = new Map<string, WordReading>(
		[...wordsByStem].map(([stem, words]) => [stem, new Map(words.map((known) => [known, 1]))])
	);
	const fuzzyVocabulary = [...usersByWord.keys()].filter(
		(word) => word.length >= MIN_FUZZY_WORD_LENGTH
	);
	// Without the field-length norm, a result's score is the Bitap errors over the word's length.
	const vocabulary = new Fuse(fuzzyVocabulary, {
		includeScore: true,
		ignoreLocation: true,
		ignoreFieldNorm: true,
		threshold: FUSE_THRESHOLD
	});
	const cachedReadings = new Map<string, WordReading>();
	const typoReadings = new WeakSet<WordReading>();

	/** The phrase words fuse.js finds close to `word`, with how alike they are (0..1). fuse.js
	 * finds the word inside a longer one as well, so a difference in length counts as errors too
	 * ("cool" is not "coolant"). */
	function searchVocabulary(word: string): [string, number][] {
		return vocabulary.search(word).map((result) => {
			const known = result.item;
			const errors = Math.max(
				Math.round((result.score ?? 1) * word.length),
				Math.abs(known.length - word.length)
			);
			return [known, 1 - errors / Math.max(word.length, known.length)];
		});
	}

	function readWord(word: string): WordReading {
		if (NEGATIONS.has(word) || CONJUNCTIONS.has(word) || LITTLE_WORDS.has(word)) return NO_READING;
		const stem = stemWord(word);
		const sameStem = readingsByStem.get(stem);
		if (sameStem) return sameStem;
		if (knownStems.has(stem) || word.length < MIN_FUZZY_WORD_LENGTH) return NO_READING;
		const cached = cachedReadings.get(word);
		if (cached) return cached;
		const reading = new Map<string, number>();
		for (const [known, similarity] of searchVocabulary(word)) {
			if (similarity >= MIN_WORD_SIMILARITY) reading.set(known, similarity);
		}
		if (reading.size > 0) typoReadings.add(reading);
		if (cachedReadings.size >= MAX_CACHED_READINGS) cachedReadings.clear();
		cachedReadings.set(word, reading);
		return reading;
	}

	// Prefix filtering (as in set-similarity joins): a phrase can miss at most `allowance` of its
	// content weight and still reach its coverage, so a segment that matches it has at least one
	// of its rarest words worth more than that allowance. Phrases are therefore listed under those
	// words only, and common words ("coolant", "engine") no longer touch hundreds of phrases.
	const contentWords: { word: string; weight: number }[][] = entries.map(() => []);
	for (const [word, users] of usersByWord) {
		for (const { entryIndex, weight } of users) contentWords[entryIndex].push({ word, weight });
	}
	const neededWeights = entries.map(
		(entry, entryIndex) => MIN_PHRASE_COVERAGE * entry.totalWeight - 1e-9 - freeWeights[entryIndex]
	);
	const prefixUsers = new Map<string, number[]>();
	contentWords.forEach((words, entryIndex) => {
		const total = words.reduce((sum, { weight }) => sum + weight, 0);
		const allowance = total - neededWeights[entryIndex];
		const rarestFirst = [...words].sort(
			(a, b) =>
				(usersByWord.get(a.word)?.length ?? 0) - (usersByWord.get(b.word)?.length ?? 0) ||
				(a.word < b.word ? -1 : a.word > b.word ? 1 : 0)
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

	// The same lists by word number, so the coverage check below compares integers.
	const wordNumbers = new Map([...usersByWord.keys()].map((word, number) => [word, number]));
	const contentWordNumbers = contentWords.map((words) =>
		Int32Array.from(words, ({ word }) => wordNumbers.get(word) as number)
	);
	const contentWordWeights = contentWords.map((words) =>
		Float64Array.from(words, ({ weight }) => weight)
	);
	const isKnownWord = new Uint8Array(wordNumbers.size);

	/** Phrases that share words with the segment and could still reach their coverage. */
	const seen = new Uint8Array(entries.length);
	function listCandidates(segmentReadings: readonly WordReading[]): number[] {
		const knownNumbers: number[] = [];
		const touched: number[] = [];
		for (const reading of segmentReadings) {
			for (const known of reading.keys()) {
				const number = wordNumbers.get(known);
				if (number === undefined || isKnownWord[number] === 1) continue;
				isKnownWord[number] = 1;
				knownNumbers.push(number);
				for (const entryIndex of prefixUsers.get(known) ?? NO_NUMBERS) {
					if (seen[entryIndex] === 0) {
						seen[entryIndex] = 1;
						touched.push(entryIndex);
					}
				}
			}
		}
		const candidates: number[] = [];
		for (const entryIndex of touched) {
			seen[entryIndex] = 0;
			const numbers = contentWordNumbers[entryIndex];
			const weights = contentWordWeights[entryIndex];
			let reached = 0;
			for (let index = 0; index < numbers.length; index++) {
				if (isKnownWord[numbers[index]] === 1) reached += weights[index];
			}
			if (reached >= neededWeights[entryIndex]) candidates.push(entryIndex);
		}
		for (const number of knownNumbers) isKnownWord[number] = 0;
		return candidates.sort((a, b) => a - b);
	}

	return {
		matchComplaint(complaint, skip = new Set()) {
			const text = complaint.slice(0, MAX_COMPLAINT_CHARS);
			const best = new Map<string, Candidate>();
			const readings = new Map<string, WordReading>();
			const readCached = (word: string) => {
				let reading = readings.get(word);
				if (!reading) {
					reading = readWord(word);
					readings.set(word, reading);
				}
				return reading;
			};
			let firstTokenIndex = 0;
			for (const segment of splitSegments(text)) {
				const segmentReadings = segment.tokens.map((token) => readCached(token.word));
				// Tokens read as a misspelling of some phrase word (not by their own stem).
				const typoTokenIndices = segmentReadings.flatMap((reading, index) =>
					typoReadings.has(reading) ? [index] : []
				);
				for (const entryIndex of listCandidates(segmentReadings)) {
					const entry = entries[entryIndex];
					const found = findBestWindow(entry, segment, segmentReadings, typoTokenIndices);
					if (!found || found.negation.doubtful) continue;
					const windowNegated = found.negation.from !== null;
					let value = entry.value;
					if (windowNegated !== entry.negated) {
						// A negated enum phrase says what it is not, which picks no value. A denial
						// of one word ("no drips") is too thin to turn round: "dripping" alone may be
						// anything dripping.
						if (entry.kind !== 'boolean') continue;
						if (entry.negated && entry.contentWordCount < 2) continue;
						value = !value;
					}
					const startToken =
						segment.tokens[Math.min(found.negation.from ?? found.start, found.start)];
					const endToken = segment.tokens[found.end - 1];
					const candidate: Candidate = {
						key: entry.key,
						value,
						from: text.slice(startToken.start, endToken.end),
						score: found.score,
						position: startToken.start,
						contentTokens: found.contentTokens.map((index) => firstTokenIndex + index)
					};
					const current = best.get(entry.key);
					if (!current || isBetterCandidate(candidate, current)) best.set(entry.key, candidate);
				}
				firstTokenIndex += segment.tokens.length;
			}
			// Answers already given still claim their words, so that the rest reads the same.
			const kept = [...best.values()];
			return kept
				.filter((candidate) => !kept.some((other) => explainsCandidate(other, candidate)))
				.filter((candidate) => !skip.has(candidate.key))
				.sort((a, b) => a.position - b.position || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
				.map(({ key, value, from, score }) => ({ key, value, from, score }));
		}
	};
}

interface Candidate extends ComplaintMatch {
	position: number;
	/** Complaint tokens (numbered across segments) that stand for the phrase's content words. */
	contentTokens: number[];
}

/** Of two readings for one observation, one that contains the other's words and more wins if it
 * is about as good ("white smoke only on cold mornings" over "white smoke"); otherwise the
 * higher score, then the one that accounts for more words ("thermostat stuck open" over "stuck
 * thermostat"), then the earlier one. */
function isBetterCandidate(candidate: Candidate, current: Candidate): boolean {
	if (containsWords(candidate, current)) {
		return candidate.score >= current.score - SUBSUMING_SCORE_SLACK;
	}
	if (containsWords(current, candidate)) {
		return current.score < candidate.score - SUBSUMING_SCORE_SLACK;
	}
	if (candidate.score !== current.score) return candidate.score > current.score;
	if (candidate.contentTokens.length !== current.contentTokens.length) {
		return candidate.contentTokens.length > current.contentTokens.length;
	}
	return candidate.position < current.position;
}

/** Whether `outer` stands on every content word of `inner` and on more. */
function containsWords(outer: Candidate, inner: Candidate): boolean {
	return (
		inner.contentTokens.length > 0 &&
		outer.contentTokens.length > inner.contentTokens.length &&
		inner.contentTokens.every((index) => outer.contentTokens.includes(index))
	);
}

/**
 * Two observations should not both be read from the same words. A match whose content words all
 * lie inside another observation's match of more words says nothing of its own: "white smoke that
 * smells sweet" is exhaust smoke, not a smell under the bonnet; "overheats sitting in traffic" is
 * the gauge pattern, not a bare "overheats". Matches that share two or more content words are
 * rival readings of one statement, and the better one stands ("top radiator hose is leaking" is a
 * leak, not a hot hose with one word missing; "coolant in the oil" is not "oil in the coolant").
 * Readings of exactly the same words that score the same both stand ("boiled over").
 */
function explainsCandidate(other: Candidate, candidate: Candidate): boolean {
	if (other.key === candidate.key) return false;
	if (containsWords(other, candidate)) {
		return other.score >= candidate.score - SUBSUMING_SCORE_SLACK;
	}
	if (containsWords(candidate, other)) return false;
	let shared = 0;
	for (const index of candidate.contentTokens) {
		if (other.contentTokens.includes(index)) shared++;
	}
	return shared >= MIN_SHARED_WORDS_FOR_RIVALS && other.score > candidate.score;
}

interface SegmentToken extends Token {
	stem: string;
}

interface Segment {
	tokens: SegmentToken[];
	words: string[];
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
		segments.push({
			tokens,
			words: tokens.map((token) => token.word),
			tokenIndicesByStem,
			clauseStart
		});
	}
	return segments;
}

/** A negation word, unless it opens a doubt ("not sure", "no idea") or speaks of the past
 * ("never used to"). */
function isNegationAt(words: readonly string[], index: number): boolean {
	const next = words[index + 1] ?? '';
	return NEGATIONS.has(words[index]) && !HEDGES.has(next) && !PAST_HABITS.has(next);
}

interface NegationReach {
	/** Index of the negation word that reaches the window, or null. */
	from: number | null;
	/** The window sits in a doubt ("not sure if …"): it says neither yes nor no. */
	doubtful: boolean;
}

interface WindowMatch {
	start: number;
	end: number;
	score: number;
	negation: NegationReach;
	/** Segment token indices standing for the phrase's content (not little) words. */
	contentTokens: number[];
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
	// The candidate list counted the phrase's little words as there; a window can only cover
	// those the segment has.
	let reachableWeight = 0;
	for (let wordIndex = 0; wordIndex < entry.words.length; wordIndex++) {
		const word = entry.words[wordIndex];
		let reachable = segment.tokenIndicesByStem.has(entry.stems[wordIndex]);
		if (!reachable && !LITTLE_WORDS.has(word)) {
			for (const index of typoTokenIndices) {
				if (readings[index].has(word)) {
					reachable = true;
					break;
				}
			}
		}
		if (reachable) reachableWeight += entry.weights[wordIndex];
	}
	if (reachableWeight < MIN_PHRASE_COVERAGE * entry.totalWeight - 1e-9) return null;
	// Tokens that fit some phrase word, in order (negation words never anchor a window).
	const isAnchor = new Uint8Array(segment.tokens.length);
	for (const stem of entry.stems) {
		for (const index of segment.tokenIndicesByStem.get(stem) ?? NO_NUMBERS) isAnchor[index] = 1;
	}
	for (const index of typoTokenIndices) {
		if (isAnchor[index] === 1) continue;
		for (const word of entry.words) {
			if (readings[index].has(word)) {
				isAnchor[index] = 1;
				break;
			}
		}
	}
	const anchors: number[] = [];
	for (let index = 0; index < isAnchor.length; index++) {
		if (isAnchor[index] === 1 && !NEGATIONS.has(segment.tokens[index].word)) anchors.push(index);
	}
	const maxLength = entry.words.length + EXTRA_WINDOW_WORDS;
	const matchedAt: number[] = new Array(entry.words.length);
	let best: WindowMatch | null = null;
	for (let first = 0; first < anchors.length; first++) {
		const start = anchors[first];
		for (let last = first; last < anchors.length; last++) {
			const end = anchors[last] + 1;
			if (end - start > maxLength) break;
			const score = scoreWindow(entry, segment, start, end, readings, matchedAt);
			if (score === null || (best && score <= best.score)) continue;
			best = {
				start,
				end,
				score,
				negation: findNegation(segment, start, end),
				contentTokens: matchedAt.filter(
					(index, wordIndex) => index >= 0 && !LITTLE_WORDS.has(entry.words[wordIndex])
				)
			};
		}
	}
	return best;
}

/**
 * Recall-weighted F-score (β = 2) of phrase words found in the window, less a little for each
 * pair of content words said in the other order, or null if too weak. `matchedAt` receives the
 * token index standing for each phrase word (-1 for none).
 */
function scoreWindow(
	entry: PhraseEntry,
	segment: Segment,
	start: number,
	end: number,
	readings: WordReading[],
	matchedAt: number[]
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
		matchedAt[wordIndex] = bestAt;
		if (bestAt >= 0) {
			used[bestAt - start] = 1;
			matchedWeight += bestFit * entry.weights[wordIndex];
		}
	}
	if (windowWeight === 0) return null;
	const recall = matchedWeight / entry.totalWeight;
	const precision = matchedWeight / windowWeight;
	if (recall < MIN_PHRASE_COVERAGE || precision === 0) return null;
	const score =
		((5 * precision * recall) / (4 * precision + recall)) *
		(1 - ORDER_PENALTY * countSwappedPairs(entry, matchedAt));
	return score >= MIN_SCORE ? Math.min(1, score) : null;
}

/** Pairs of the phrase's content words that the window says in the opposite order. */
function countSwappedPairs(entry: PhraseEntry, matchedAt: readonly number[]): number {
	let swapped = 0;
	for (let i = 0; i < matchedAt.length; i++) {
		if (matchedAt[i] < 0 || LITTLE_WORDS.has(entry.words[i])) continue;
		for (let j = i + 1; j < matchedAt.length; j++) {
			if (matchedAt[j] >= 0 && !LITTLE_WORDS.has(entry.words[j]) && matchedAt[j] < matchedAt[i]) {
				swapped++;
			}
		}
	}
	return swapped;
}

/**
 * A negation inside the window, or up to a few words before it in the same clause. A doubt
 * earlier in the clause ("not sure if", "don't know whether") leaves the window unanswered.
 */
function findNegation(segment: Segment, start: number, end: number): NegationReach {
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
