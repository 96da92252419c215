// Complaint matching: reads a customer's free text as answers to the rulebook's observations.
import type { ObservationValue, Rulebook } from '../schema';
import {
	buildPhraseIndex,
	listCandidates,
	type PhraseEntry,
	type PhraseIndex
} from './phrase-index';
import { isBetterCandidate, settleRivals, type Candidate, type ComplaintMatch } from './rivals';
import { isPartialReading } from './polarity';
import { splitSegments, type Segment } from './segments';
import { buildVocabulary, readWord, type Vocabulary, type WordReading } from './vocabulary';
import { findBestWindow, type WindowMatch } from './windows';

export type { ComplaintMatch } from './rivals';

const MAX_COMPLAINT_CHARS = 2000;

export interface ComplaintMatcher {
	matchComplaint(complaint: string, skip?: ReadonlySet<string>): ComplaintMatch[];
}

/**
 * Built once per edition. Each complaint word is read as the phrase words it stands for: the
 * same word or stem, or, for a word the phrases do not use, a close misspelling found by fuse.js
 * over the phrases' vocabulary ("trafic" for "traffic"). Phrases that share a content word with a
 * stretch of the complaint are then scored on word windows of that stretch, by weighted word
 * overlap that favours covering the whole phrase.
 */
export function buildComplaintMatcher(rulebook: Rulebook): ComplaintMatcher {
	const index = buildPhraseIndex(rulebook);
	const vocabulary = buildVocabulary(index);
	return {
		matchComplaint: (complaint, skip = new Set()) =>
			matchComplaint(index, vocabulary, complaint, skip)
	};
}

export function matchComplaint(
	index: PhraseIndex,
	vocabulary: Vocabulary,
	complaint: string,
	skip: ReadonlySet<string> = new Set()
): ComplaintMatch[] {
	const text = complaint.slice(0, MAX_COMPLAINT_CHARS);
	const best = new Map<string, Candidate>();
	const readings = new Map<string, WordReading>();
	const read = (word: string) => {
		let reading = readings.get(word);
		if (!reading) {
			reading = readWord(vocabulary, word);
			readings.set(word, reading);
		}
		return reading;
	};
	let firstTokenIndex = 0;
	for (const segment of splitSegments(text)) {
		const byToken = segment.tokens.map((token) => read(token.word));
		const misspelt = byToken.flatMap((reading, token) => (reading.misspelt ? [token] : []));
		const segmentReadings = { byToken, misspelt };
		for (const entryIndex of listCandidates(index, byToken)) {
			const entry = index.entries[entryIndex];
			const found = findBestWindow(entry, segment, segmentReadings);
			const value = found ? readValue(entry, segment, found) : undefined;
			if (!found || value === undefined) continue;
			const candidate = describeCandidate(text, segment, entry, found, value, firstTokenIndex);
			const current = best.get(entry.key);
			if (!current || isBetterCandidate(candidate, current)) best.set(entry.key, candidate);
		}
		firstTokenIndex += segment.tokens.length;
	}
	return settleRivals(best.values(), skip);
}

/**
 * The answer a window gives, or undefined for none: a doubt answers nothing; a negated enum
 * phrase says what it is not, which picks no value; a denial of one word ("no drips") is too thin
 * to turn round ("dripping" alone may be anything dripping); a late or weak yes ("the fan comes
 * on late") is no plain yes.
 */
function readValue(
	entry: PhraseEntry,
	segment: Segment,
	found: WindowMatch
): ObservationValue | undefined {
	if (found.negation.doubtful) return undefined;
	const windowNegated = found.negation.from !== null;
	let value = entry.value;
	if (windowNegated !== entry.negated) {
		if (entry.kind !== 'boolean') return undefined;
		if (entry.negated && entry.contentWordCount < 2) return undefined;
		value = !entry.value;
	}
	if (value === true && isPartialReading(segment, found.start, found.end, entry.words)) {
		return undefined;
	}
	return value;
}

function describeCandidate(
	text: string,
	segment: Segment,
	entry: PhraseEntry,
	found: WindowMatch,
	value: ObservationValue,
	firstTokenIndex: number
): Candidate {
	const startToken = segment.tokens[Math.min(found.negation.from ?? found.start, found.start)];
	const endToken = segment.tokens[found.end - 1];
	return {
		key: entry.key,
		value,
		from: text.slice(startToken.start, endToken.end),
		score: found.score,
		position: startToken.start,
		contentTokens: found.contentTokens.map((token) => firstTokenIndex + token)
	};
}
