const formatters = new Map<number, Intl.NumberFormat>();

/**
 * Formats a number for a sentence a person reads: grouped thousands, at most `maxDecimals`
 * decimals, trailing zeros dropped and a true minus sign (a hyphen reads as a dash in "−37 °C").
 */
export function formatNumber(value: number, maxDecimals = 2): string {
	let formatter = formatters.get(maxDecimals);
	if (!formatter) {
		formatter = new Intl.NumberFormat('en-GB', { maximumFractionDigits: maxDecimals });
		formatters.set(maxDecimals, formatter);
	}
	const text = formatter.format(value);
	// A value that rounds to zero must not print as "−0".
	if (/^-0(\.0*)?$/.test(text)) return '0';
	return text.replace('-', '−');
}

/** Rounds to a fixed number of decimals without the float noise of toFixed on values like 1.005. */
export function roundTo(value: number, decimals: number): number {
	const rounded = Number(Math.round(Number(`${value}e${decimals}`)) + `e-${decimals}`);
	// Exponent notation fails for very small or very large magnitudes; fall back to plain scaling.
	const result = Number.isFinite(rounded)
		? rounded
		: Math.round(value * 10 ** decimals) / 10 ** decimals;
	return Object.is(result, -0) ? 0 : result;
}
