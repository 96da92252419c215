// Window scoring: the stretch of a segment that best says one phrase, scored by weighted overlap.
import { isLittleWord, weighWord } from './normalise';
import { MIN_PHRASE_COVERAGE, type PhraseEntry } from './phrase-index';
import { findNegation, type NegationReach } from './polarity';
import type { Segment, SegmentToken } from './segments';
import type { WordReading } from './vocabulary';
import { CONJUNCTIONS, NEGATIONS } from './word-lists';

const MIN_SCORE = 0.75;
/** A window may be this many words longer than the phrase it is compared with. */
const EXTRA_WINDOW_WORDS = 3;
/** Score lost per pair of content words said in the other order: "reservoir is cracked" still
 * reads as "cracked reservoir", but "coolant in the oil" reads closer to its own phrase than to
 * "oil in the coolant". */
const ORDER_PENALTY = 0.04;

/** A segment's word readings, and which tokens were read as misspellings. */
export interface SegmentReadings {
	byToken: readonly WordReading[];
	misspelt: readonly number[];
}

export interface WindowMatch {
	start: number;
	end: number;
	score: number;
	negation: NegationReach;
	/** Segment token indices standing for the phrase's content (not little) words. */
	contentTokens: number[];
}

/**
 * The best-scoring window of the segment for this phrase. Windows start and end on tokens that
 * fit some phrase word: a window edge on a word the phrase lacks only lowers the score.
 */
export function findBestWindow(
	entry: PhraseEntry,
	segment: Segment,
	readings: SegmentReadings
): WindowMatch | null {
	if (!canReachCoverage(entry, segment, readings)) return null;
	const anchors = listAnchors(entry, segment, readings);
	const maxLength = entry.words.length + EXTRA_WINDOW_WORDS;
	const matchedAt: number[] = new Array(entry.words.length);
	let best: WindowMatch | null = null;
	for (let first = 0; first < anchors.length; first++) {
		const start = anchors[first];
		for (let last = first; last < anchors.length; last++) {
			const end = anchors[last] + 1;
			if (end - start > maxLength) break;
			const score = scoreWindow(entry, segment, start, end, readings.byToken, matchedAt);
			if (score === null || (best && score <= best.score)) continue;
			best = {
				start,
				end,
				score,
				negation: findNegation(segment, start, end),
				contentTokens: matchedAt.filter(
					(index, wordIndex) => index >= 0 && !isLittleWord(entry.words[wordIndex])
				)
			};
		}
	}
	return best;
}

/** The candidate list counted the phrase's little words as there; a window can only cover those
 * the segment has. */
function canReachCoverage(
	entry: PhraseEntry,
	segment: Segment,
	readings: SegmentReadings
): boolean {
	let reachableWeight = 0;
	entry.words.forEach((word, wordIndex) => {
		const reachable =
			segment.tokenIndicesByStem.has(entry.stems[wordIndex]) ||
			(!isLittleWord(word) &&
				readings.misspelt.some((index) => readings.byToken[index].fits.has(word)));
		if (reachable) reachableWeight += entry.weights[wordIndex];
	});
	return reachableWeight >= MIN_PHRASE_COVERAGE * entry.totalWeight - 1e-9;
}

/** Tokens that fit some phrase word, in order (negation words never anchor a window). */
function listAnchors(entry: PhraseEntry, segment: Segment, readings: SegmentReadings): number[] {
	const isAnchor = new Uint8Array(segment.tokens.length);
	for (const stem of entry.stems) {
		for (const index of segment.tokenIndicesByStem.get(stem) ?? []) isAnchor[index] = 1;
	}
	for (const index of readings.misspelt) {
		const { fits } = readings.byToken[index];
		if (entry.words.some((word) => fits.has(word))) isAnchor[index] = 1;
	}
	const anchors: number[] = [];
	for (let index = 0; index < isAnchor.length; index++) {
		if (isAnchor[index] === 1 && !NEGATIONS.has(segment.tokens[index].word)) anchors.push(index);
	}
	return anchors;
}

/** How well complaint token `token` stands for phrase word `wordIndex` of `entry` (0..1). */
function measureTokenFit(
	entry: PhraseEntry,
	wordIndex: number,
	token: SegmentToken,
	reading: WordReading
): number {
	if (token.stem === entry.stems[wordIndex]) return 1;
	return reading.fits.get(entry.words[wordIndex]) ?? 0;
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
	readings: readonly WordReading[],
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
		if (matchedAt[i] < 0 || isLittleWord(entry.words[i])) continue;
		for (let j = i + 1; j < matchedAt.length; j++) {
			if (matchedAt[j] >= 0 && !isLittleWord(entry.words[j]) && matchedAt[j] < matchedAt[i]) {
				swapped++;
			}
		}
	}
	return swapped;
}
