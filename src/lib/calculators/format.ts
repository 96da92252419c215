// The one home of small number and path helpers: rounding, number and issue-path formats.
// Pure, imports nothing, so the calculators, the diagnosis engine and the API all use it.

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

/**
 * `value` rounded half up to `decimals` places, without the float noise of plain scaling on
 * values like 1.005; never -0.
 */
export function roundTo(value: number, decimals: number): number {
	const rounded = Number(Math.round(Number(`${value}e${decimals}`)) + `e-${decimals}`);
	// Exponent notation fails for very small or very large magnitudes; fall back to plain scaling.
	const result = Number.isFinite(rounded)
		? rounded
		: Math.round(value * 10 ** decimals) / 10 ** decimals;
	return Object.is(result, -0) ? 0 : result;
}

/**
 * A converted figure to as many significant digits as the person gave (at least 4, at most 12):
 * "110 kPa" reads 15.95 psi, not 15.9541511503 psi.
 */
export function formatSignificant(value: number, digits: number): string {
	const kept = Math.min(12, Math.max(4, digits));
	const rounded = Number(value.toPrecision(kept));
	return formatNumber(
		rounded,
		Math.max(0, kept - 1 - Math.floor(Math.log10(Math.abs(rounded) || 1)))
	);
}

/** Significant digits in a number as typed ("110" 3, "0.050" 2, "1.50" 3). */
export function countSignificantDigits(text: string): number {
	const digits = text
		.replace(/[eE].*$/, '')
		.replace(/[^0-9]/g, '')
		.replace(/^0+/, '');
	return Math.max(1, digits.length);
}

/** `['rules', 12, 'conditions', 'all', 0]` → `rules[12].conditions.all[0]`. */
export function formatIssuePath(path: readonly PropertyKey[]): string {
	let out = '';
	for (const segment of path) {
		if (typeof segment === 'number') out += `[${segment}]`;
		else out += out === '' ? String(segment) : `.${String(segment)}`;
	}
	return out;
}
