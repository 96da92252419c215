/**
 * Monotone piecewise cubic Hermite interpolation (PCHIP): the Fritsch–Carlson monotone cubic,
 * with the interior slopes taken as the weighted harmonic mean of the neighbouring secants
 * (Fritsch–Butland) and the shape-preserving three-point end slopes, as in the common PCHIP
 * implementations. Chosen because a table of freeze points is monotone and a plain cubic
 * spline can overshoot between points, which would invent protection the table never showed.
 */
export interface MonotoneCubic {
	readonly xMin: number;
	readonly xMax: number;
	/** y at x; x must lie within [xMin, xMax]: this never extrapolates. */
	evaluate(x: number): number;
	/** x at which the curve reaches y; y must lie within the table's y range. */
	invert(y: number): number;
}

/** The table and its Hermite slopes: all a segment needs to be evaluated. */
interface CubicSegments {
	xs: readonly number[];
	ys: readonly number[];
	/** Width of each segment. */
	h: readonly number[];
	/** Slope at each table point. */
	slopes: readonly number[];
}

export function createMonotoneCubic(xs: readonly number[], ys: readonly number[]): MonotoneCubic {
	const n = xs.length;
	if (n < 2 || ys.length !== n) {
		throw new Error('A monotone cubic needs at least two points and as many y as x values.');
	}
	for (let i = 1; i < n; i++) {
		if (!(xs[i] > xs[i - 1])) throw new Error('Table x values must increase strictly.');
	}
	const h: number[] = [];
	const secant: number[] = [];
	for (let i = 0; i < n - 1; i++) {
		h.push(xs[i + 1] - xs[i]);
		secant.push((ys[i + 1] - ys[i]) / h[i]);
	}
	const curve: CubicSegments = { xs, ys, h, slopes: findSlopes(h, secant) };
	const xMin = xs[0];
	const xMax = xs[n - 1];
	const yLow = Math.min(ys[0], ys[n - 1]);
	const yHigh = Math.max(ys[0], ys[n - 1]);

	function evaluate(x: number): number {
		if (!(x >= xMin && x <= xMax)) {
			throw new RangeError(`x = ${x} lies outside the table (${xMin} to ${xMax}).`);
		}
		return evaluateInSegment(curve, findSegment(xs, x), x);
	}

	function invert(y: number): number {
		if (!(y >= yLow && y <= yHigh)) {
			throw new RangeError(`y = ${y} lies outside the table (${yLow} to ${yHigh}).`);
		}
		return invertInRange(curve, y);
	}

	return { xMin, xMax, evaluate, invert };
}

/** The segment holding x (x within the table): the last one starting at or before it. */
function findSegment(xs: readonly number[], x: number): number {
	let low = 0;
	let high = xs.length - 2;
	while (low < high) {
		const mid = (low + high + 1) >> 1;
		if (xs[mid] <= x) low = mid;
		else high = mid - 1;
	}
	return low;
}

function evaluateInSegment(curve: CubicSegments, k: number, x: number): number {
	const { xs, ys, h, slopes } = curve;
	const t = (x - xs[k]) / h[k];
	const t2 = t * t;
	const t3 = t2 * t;
	return (
		(2 * t3 - 3 * t2 + 1) * ys[k] +
		(t3 - 2 * t2 + t) * h[k] * slopes[k] +
		(-2 * t3 + 3 * t2) * ys[k + 1] +
		(t3 - t2) * h[k] * slopes[k + 1]
	);
}

/** x at which the curve reaches y, for y within the table's y range. */
function invertInRange(curve: CubicSegments, y: number): number {
	const { xs, ys } = curve;
	const n = xs.length;
	const increasing = ys[n - 1] > ys[0];
	for (let i = 0; i < n; i++) if (ys[i] === y) return xs[i];
	let k = 0;
	while (k < n - 2 && (increasing ? ys[k + 1] < y : ys[k + 1] > y)) k++;
	// Each segment is monotone, so bisection on it converges to the one answer; 80 halvings
	// take any table segment below double-precision resolution.
	let low = xs[k];
	let high = xs[k + 1];
	for (let i = 0; i < 80 && high - low > 0; i++) {
		const mid = (low + high) / 2;
		if (mid === low || mid === high) break;
		const value = evaluateInSegment(curve, k, mid);
		const below = increasing ? value < y : value > y;
		if (below) low = mid;
		else high = mid;
	}
	return (low + high) / 2;
}

function findSlopes(h: readonly number[], secant: readonly number[]): number[] {
	const segments = h.length;
	if (segments === 1) return [secant[0], secant[0]];
	const slopes: number[] = new Array<number>(segments + 1).fill(0);
	for (let k = 1; k < segments; k++) {
		const before = secant[k - 1];
		const after = secant[k];
		if (before === 0 || after === 0 || Math.sign(before) !== Math.sign(after)) continue;
		const w1 = 2 * h[k] + h[k - 1];
		const w2 = h[k] + 2 * h[k - 1];
		slopes[k] = (w1 + w2) / (w1 / before + w2 / after);
	}
	slopes[0] = findEndSlope(h[0], h[1], secant[0], secant[1]);
	slopes[segments] = findEndSlope(
		h[segments - 1],
		h[segments - 2],
		secant[segments - 1],
		secant[segments - 2]
	);
	return slopes;
}

/** Three-point end slope, clipped so the end segment keeps the table's direction. */
function findEndSlope(h0: number, h1: number, secant0: number, secant1: number): number {
	const slope = ((2 * h0 + h1) * secant0 - h0 * secant1) / (h0 + h1);
	if (Math.sign(slope) !== Math.sign(secant0)) return 0;
	if (Math.sign(secant0) !== Math.sign(secant1) && Math.abs(slope) > Math.abs(3 * secant0)) {
		return 3 * secant0;
	}
	return slope;
}
