// Rival readings: one match per observation, and no two observations read from the same words.
import { compareKeys } from '../rank';
import type { ObservationValue } from '../schema';

export interface ComplaintMatch {
	key: string;
	value: ObservationValue;
	/** The part of the complaint, as written, that gave the match. */
	from: string;
	/** 0..1, 1 = the phrase exactly. Full precision until a response is built. */
	score: number;
}

export interface Candidate extends ComplaintMatch {
	position: number;
	/** Complaint tokens (numbered across segments) that stand for the phrase's content words. */
	contentTokens: number[];
}

/** A longer match of another observation may be this much weaker and still explain a match
 * whose words it contains. */
const SUBSUMING_SCORE_SLACK = 0.1;
/** Matches of two observations sharing this many content words are rival readings. */
const MIN_SHARED_WORDS_FOR_RIVALS = 2;

/** Of two readings for one observation, one that contains the other's words and more wins if it
 * is about as good ("white smoke only on cold mornings" over "white smoke"); otherwise the
 * higher score, then the one that accounts for more words ("thermostat stuck open" over "stuck
 * thermostat"), then the earlier one. */
export function isBetterCandidate(candidate: Candidate, current: Candidate): boolean {
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

/** The best reading per observation, less those another reading explains and those skipped,
 * in the complaint's order. Skipped observations still claim their words, so that the rest
 * reads the same whether or not they were answered. */
export function settleRivals(
	best: Iterable<Candidate>,
	skip: ReadonlySet<string>
): ComplaintMatch[] {
	const kept = [...best];
	return kept
		.filter((candidate) => !kept.some((other) => explainsCandidate(other, candidate)))
		.filter((candidate) => !skip.has(candidate.key))
		.sort((a, b) => a.position - b.position || compareKeys(a.key, b.key))
		.map(({ key, value, from, score }) => ({ key, value, from, score }));
}
