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

/**
 * 1 for the same word or the same stem; a typo's similarity for a word the phrases do not use
 * themselves ("trafic" for "traffic"); 0 otherwise. A word the phrases know is taken as meant,
 * so "dripping" never reads as "dropping", nor "seam" as "steam".
 */
function measureWordSimilarity(
	phraseWord: string,
	word: string,
	lexicon: ReadonlySet<string>
): number {
	if (phraseWord === word || stemWord(phraseWord) === stemWord(word)) return 1;
	if (lexicon.has(word) || lexicon.has(stemWord(word))) return 0;
	if (Math.min(phraseWord.length, word.length) < MIN_FUZZY_WORD_LENGTH) return 0;
	const similarity =
		1 - measureEditDistance(phraseWord, word) / Math.max(phraseWord.length, word.length);
	return similarity >= MIN_WORD_SIMILARITY ? similarity : 0;
}

function weighWord(word: string): number {
	return LITTLE_WORDS.has(word) ? LITTLE_WORD_WEIGHT : 1;
}

interface PhraseEntry {
	key: string;
	kind: Observation['kind'];
	value: ObservationValue;
	text: string;
	/** Phrase words without negations; the phrase's own negation is kept in `negated`. */
	words: string[];
	weights: number[];
	totalWeight: number;
	negated: boolean;
	conjunctions: Set<string>;
}

export interface ComplaintMatcher {
	matchComplaint(complaint: string, skip?: ReadonlySet<string>): ComplaintMatch[];
}

/**
 * Built once per edition. fuse.js (token search) finds the phrases that share words with each
 * stretch of the complaint; each candidate is then scored against word windows of that stretch
 * by weighted word overlap that favours covering the whole phrase.
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
				text: phrase.text,
				words,
				weights,
				totalWeight: weights.reduce((sum, weight) => sum + weight, 0),
				negated: tokens.some((word) => NEGATIONS.has(word)),
				conjunctions: new Set(words.filter((word) => CONJUNCTIONS.has(word)))
			});
		}
	}
	const lexicon = new Set(
		entries.flatMap((entry) => entry.words.flatMap((word) => [word, stemWord(word)]))
	);
	const fuse = new Fuse(entries, {
		keys: ['text'],
		useTokenSearch: true,
		ignoreLocation: true,
		includeScore: true,
		threshold: 0.4
	});

	return {
		matchComplaint(complaint, skip = new Set()) {
			const text = complaint.slice(0, MAX_COMPLAINT_CHARS);
			const best = new Map<string, ComplaintMatch & { position: number }>();
			for (const segment of splitSegments(text)) {
				const candidates = fuse
					.search(segment.tokens.map((token) => token.word).join(' '))
					.map((result) => result.item);
				for (const entry of candidates) {
					if (skip.has(entry.key)) continue;
					const found = findBestWindow(entry, segment, lexicon);
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

interface Segment {
	tokens: Token[];
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
			start: token.start + offset,
			end: token.end + offset
		}));
		if (tokens.length === 0) continue;
		const clauseStart: number[] = [];
		let start = 0;
		tokens.forEach((token, index) => {
			if (CONJUNCTIONS.has(token.word)) start = index + 1;
			clauseStart.push(start);
		});
		segments.push({ tokens, clauseStart });
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

function findBestWindow(
	entry: PhraseEntry,
	segment: Segment,
	lexicon: ReadonlySet<string>
): WindowMatch | null {
	const { tokens } = segment;
	const maxLength = entry.words.length + EXTRA_WINDOW_WORDS;
	let best: WindowMatch | null = null;
	for (let start = 0; start < tokens.length; start++) {
		if (NEGATIONS.has(tokens[start].word)) continue;
		const words: string[] = [];
		for (let end = start + 1; end <= Math.min(tokens.length, start + maxLength); end++) {
			const word = tokens[end - 1].word;
			if (CONJUNCTIONS.has(word) && !entry.conjunctions.has(word)) break;
			if (!NEGATIONS.has(word)) words.push(word);
			if (words.length === 0) continue;
			const score = scoreWindow(entry, words, lexicon);
			if (score === null || (best && score <= best.score)) continue;
			best = { start, end, score, negatedFrom: findNegation(segment, start, end) };
		}
	}
	return best;
}

/** Recall-weighted F-score (β = 2) of phrase words found in the window, or null if too weak. */
function scoreWindow(
	entry: PhraseEntry,
	windowWords: string[],
	lexicon: ReadonlySet<string>
): number | null {
	const used = new Uint8Array(windowWords.length);
	let matchedWeight = 0;
	entry.words.forEach((phraseWord, phraseIndex) => {
		let bestSimilarity = 0;
		let bestIndex = -1;
		windowWords.forEach((windowWord, windowIndex) => {
			if (used[windowIndex]) return;
			const similarity = measureWordSimilarity(phraseWord, windowWord, lexicon);
			if (similarity > bestSimilarity) {
				bestSimilarity = similarity;
				bestIndex = windowIndex;
			}
		});
		if (bestIndex >= 0) {
			used[bestIndex] = 1;
			matchedWeight += bestSimilarity * entry.weights[phraseIndex];
		}
	});
	const windowWeight = windowWords.reduce((sum, word) => sum + weighWord(word), 0);
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
