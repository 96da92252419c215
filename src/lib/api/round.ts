// How many decimals each figure the diagnosis API answers carries (rounded by ../calculators/format).

/** Decimals of a cause's probability, a complaint match's score and a question's gain in bits. */
export const PROBABILITY_DECIMALS = 4;
export const MATCH_SCORE_DECIMALS = 4;
export const GAIN_DECIMALS = 4;
/** A test's score is probability per minute: small numbers, so more decimals. */
export const TEST_SCORE_DECIMALS = 6;
