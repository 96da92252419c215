// Replay: stored answer sets scored again through an edition's json-rules-engine, in order.
import type { DiagnoseInput, Diagnoser } from './index';

/** A stored answer set: what a case was scored on. */
export type ReplayCase = DiagnoseInput;

export interface ReplayResult {
	/** Every cause, most probable first, at full precision. */
	causes: { key: string; probability: number }[];
	firedRules: string[];
}

/** Most cases one call replays; a longer list is refused rather than left to run unbounded. */
export const MAX_REPLAY_CASES = 100_000;

/**
 * Scores each case with the diagnoser's edition, one after another (each run has its own engine,
 * so nothing is gained by overlapping them on one thread). Returns one result per case, in order.
 */
export async function replay(
	diagnoser: Diagnoser,
	cases: readonly ReplayCase[]
): Promise<ReplayResult[]> {
	if (cases.length > MAX_REPLAY_CASES) {
		throw new RangeError(`replay takes at most ${MAX_REPLAY_CASES} cases, not ${cases.length}`);
	}
	const results: ReplayResult[] = [];
	for (const input of cases) {
		const { causes, firedRules } = await diagnoser.rank(input);
		results.push({
			causes: causes.map(({ key, probability }) => ({ key, probability })),
			firedRules
		});
	}
	return results;
}
