// The one rounding of the diagnosis API: how many decimals each figure it answers carries.

/** Decimals of a cause's probability, a complaint match's score and a question's gain in bits. */
export const PROBABILITY_DECIMALS = 4;
export const MATCH_SCORE_DECIMALS = 4;
export const GAIN_DECIMALS = 4;
/** A test's score is probability per minute: small numbers, so more decimals. */
export const TEST_SCORE_DECIMALS = 6;

/** `value` rounded half up to `decimals` places; never -0. */
export function roundTo(value: number, decimals: number): number {
	const factor = 10 ** decimals;
	const rounded = Math.round(value * factor) / factor;
	return rounded === 0 ? 0 : rounded;
}
