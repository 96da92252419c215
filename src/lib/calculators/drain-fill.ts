// Partial drain-and-fill: the fresh share after each cycle, and the cycles a target needs.
import { CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE, CAUTION_HOT_CAP } from './cautions';
import { throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber, roundTo } from './format';
import { checkRange, inputRanges } from './ranges';
import { toQuantity, type CalculatorResult, type Quantity, type ResultChart } from './result';

/**
 * Partial drain-and-fill: each cycle drains d of the V litres (well mixed after a run) and
 * refills with fresh coolant, so the old share shrinks by (1 − d/V) per cycle and the fresh
 * fraction after n cycles is 1 − (1 − d/V)^n. A drain rarely empties the block and heater,
 * which is why one drain-and-fill renews only part of the coolant.
 */
export interface DrainFillInput {
	capacityL: number;
	drainL: number;
	/** Number of drain-and-fill cycles to evaluate. */
	cycles?: number;
	/** Share of fresh coolant wanted, %; the answer then includes the cycles needed. */
	targetFreshPercent?: number;
}

export type DrainFillValues = {
	renewedPerCycle: Quantity<'%'>;
	freshAfterCycles: Quantity<'%'> | null;
	cycles: Quantity<'cycles'> | null;
	cyclesNeeded: Quantity<'cycles'> | null;
	freshAfterCyclesNeeded: Quantity<'%'> | null;
	coolantNeeded: Quantity<'L'> | null;
};

/** The most cycles anyone would do; also keeps a near-zero drain from asking for millions. */
export const MAX_CYCLES = inputRanges.cycles.max;

export function checkDrainFillVolumes(capacityL: number, drainL: number): CalculatorIssue[] {
	const issues = [
		...checkRange(capacityL, inputRanges.capacityL, 'capacityL'),
		...checkRange(drainL, inputRanges.drainL, 'drainL')
	];
	if (issues.length === 0 && drainL > capacityL) {
		issues.push({
			path: 'drainL',
			message: `Drain volume cannot be larger than the system capacity (${formatNumber(capacityL, 2)} L).`
		});
	}
	return issues;
}

/** The cycles a person asks about: at least one (0 cycles renews nothing), at most MAX_CYCLES. */
export function checkCycles(cycles: number, path = 'cycles'): CalculatorIssue[] {
	return checkRange(cycles, inputRanges.cycles, path);
}

/**
 * Cycles needed as a real number: log(1 − target) / log(1 − d/V). log1p keeps the share renewed
 * per cycle from rounding to nothing when d/V is tiny (1 L of 1e17 L), where the plain logarithm
 * gives log(1) = 0 and the ratio turns infinite.
 */
function exactCycles(renewed: number, targetFraction: number): number {
	return Math.log1p(-targetFraction) / Math.log1p(-renewed);
}

export function checkTargetFraction(
	capacityL: number,
	drainL: number,
	targetFraction: number,
	path = 'targetFreshPercent'
): CalculatorIssue[] {
	if (!Number.isFinite(targetFraction) || targetFraction < 0 || targetFraction > 1) {
		return [{ path, message: 'The share of fresh coolant must be between 0 and 100 %.' }];
	}
	if (targetFraction > 0 && drainL === 0) {
		return [
			{ path: 'drainL', message: 'Draining 0 L renews nothing: give the volume that comes out.' }
		];
	}
	if (targetFraction >= 1 && drainL < capacityL) {
		return [
			{
				path,
				message: `A partial drain never reaches 100 % fresh coolant: some old coolant always stays behind. Choose a target below 100 %, or drain the whole ${formatNumber(capacityL, 2)} L.`
			}
		];
	}
	const renewed = drainL / capacityL;
	// Written as "not at most" so that an infinite or undefined ratio is refused too.
	if (targetFraction > 0 && renewed < 1 && !(exactCycles(renewed, targetFraction) <= MAX_CYCLES)) {
		return [
			{
				path,
				message: `Reaching ${formatNumber(targetFraction * 100, 1)} % fresh coolant by draining ${formatNumber(drainL, 2)} L at a time would take more than ${MAX_CYCLES} cycles: drain more per cycle or flush the system.`
			}
		];
	}
	return [];
}

/**
 * Fraction (0–1) of fresh coolant after n drain-and-fill cycles of d litres from V litres. Zero
 * cycles is allowed here (the arithmetic of "before the first cycle"); a person's input is not.
 */
export function findFreshFraction(capacityL: number, drainL: number, cycles: number): number {
	const cycleIssues = cycles === 0 ? [] : checkCycles(cycles);
	throwIfIssues([...checkDrainFillVolumes(capacityL, drainL), ...cycleIssues]);
	if (cycles === 0) return 0;
	return -Math.expm1(cycles * Math.log1p(-drainL / capacityL));
}

/** Fewest whole cycles that reach the target fraction (0–1) of fresh coolant. */
export function findCyclesNeeded(
	capacityL: number,
	drainL: number,
	targetFraction: number
): number {
	throwIfIssues(checkDrainFillVolumes(capacityL, drainL));
	throwIfIssues(checkTargetFraction(capacityL, drainL, targetFraction));
	if (targetFraction === 0) return 0;
	if (drainL === capacityL) return 1;
	const fresh = (n: number) => findFreshFraction(capacityL, drainL, n);
	const exact = exactCycles(drainL / capacityL, targetFraction);
	// A ratio such as 2.0000000001 from rounding must not cost a whole extra cycle, and the
	// answer must truly reach the target, so settle it by evaluating the formula itself. The
	// check above keeps `exact` at most MAX_CYCLES, so a correction is one step; two are allowed.
	let cycles = Math.min(MAX_CYCLES, Math.max(1, Math.ceil(exact - 1e-9)));
	for (let step = 0; step < 2 && cycles > 1 && fresh(cycles - 1) >= targetFraction - 1e-12; step++)
		cycles--;
	for (
		let step = 0;
		step < 2 && cycles < MAX_CYCLES && fresh(cycles) < targetFraction - 1e-12;
		step++
	)
		cycles++;
	return cycles;
}

export function checkDrainFillInput(input: DrainFillInput): CalculatorIssue[] {
	const issues = checkDrainFillVolumes(input.capacityL, input.drainL);
	if (input.cycles !== undefined) issues.push(...checkCycles(input.cycles));
	const target = input.targetFreshPercent;
	if (target !== undefined) {
		const targetIssues = checkRange(target, inputRanges.targetFreshPercent, 'targetFreshPercent');
		issues.push(...targetIssues);
		if (issues.length === 0) {
			issues.push(...checkTargetFraction(input.capacityL, input.drainL, target / 100));
		}
	}
	return issues;
}

export function calculateDrainFill(input: DrainFillInput): CalculatorResult<DrainFillValues> {
	throwIfIssues(checkDrainFillInput(input));
	const { capacityL, drainL } = input;
	const renewed = drainL / capacityL;
	const cycles = input.cycles ?? (input.targetFreshPercent === undefined ? 1 : undefined);
	const steps = [
		`Each cycle renews ${formatNumber(drainL, 2)} / ${formatNumber(capacityL, 2)} = ${formatNumber(renewed * 100, 1)} % of the coolant.`,
		'Fresh share after n cycles = 1 − (1 − drained / capacity)^n.'
	];
	let freshAfterCycles: number | null = null;
	if (cycles !== undefined) {
		freshAfterCycles = findFreshFraction(capacityL, drainL, cycles);
		steps.push(
			`After ${cycles} cycle${cycles === 1 ? '' : 's'}: 1 − (1 − ${formatNumber(renewed, 4)})^${cycles} = ${formatNumber(freshAfterCycles * 100, 1)} % fresh coolant.`
		);
	}
	let cyclesNeeded: number | null = null;
	if (input.targetFreshPercent !== undefined) {
		cyclesNeeded = findCyclesNeeded(capacityL, drainL, input.targetFreshPercent / 100);
		steps.push(
			`${cyclesNeeded} cycle${cyclesNeeded === 1 ? '' : 's'} reach ${formatNumber(input.targetFreshPercent, 1)} % fresh coolant (${formatNumber(findFreshFraction(capacityL, drainL, cyclesNeeded) * 100, 1)} %).`
		);
	}
	const totalCycles = cyclesNeeded ?? cycles ?? 0;
	if (totalCycles > 0) {
		steps.push(
			'Between cycles, run the engine with the heater on full so the new coolant mixes through the block and heater, then let it cool before the next drain.'
		);
	}
	return {
		values: {
			renewedPerCycle: toQuantity(renewed * 100, '%', 1),
			freshAfterCycles:
				freshAfterCycles === null ? null : toQuantity(freshAfterCycles * 100, '%', 1),
			cycles: cycles === undefined ? null : toQuantity(cycles, 'cycles'),
			cyclesNeeded: cyclesNeeded === null ? null : toQuantity(cyclesNeeded, 'cycles'),
			freshAfterCyclesNeeded:
				cyclesNeeded === null
					? null
					: toQuantity(findFreshFraction(capacityL, drainL, cyclesNeeded) * 100, '%', 1),
			coolantNeeded: toQuantity(drainL * totalCycles, 'L', 2)
		},
		basis:
			'Dilution by repeated partial drain-and-fill, assuming the coolant is well mixed before each drain: fresh share = 1 − (1 − drained / capacity)^cycles.',
		accuracy:
			'Only as good as the drained volume: measure what actually comes out. Coolant that does not circulate between cycles (heater valve closed, thermostat shut) lowers the real figure.',
		warnings: [],
		cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
		charts: totalCycles > 0 ? [describeFreshChart(input, totalCycles)] : [],
		steps
	};
}

/** One bar per cycle (at most MAX_CYCLES), from the same formula as the answer. */
function describeFreshChart(input: DrainFillInput, totalCycles: number): ResultChart {
	const points = [];
	for (let cycle = 1; cycle <= Math.min(totalCycles, MAX_CYCLES); cycle++) {
		const fresh = findFreshFraction(input.capacityL, input.drainL, cycle) * 100;
		points.push({ x: cycle, y: roundTo(fresh, 1) });
	}
	return {
		id: 'fresh-share',
		kind: 'bars',
		title: 'Fresh coolant after each cycle',
		x: { label: 'Drain-and-fill cycle', unit: '' },
		y: { label: 'Fresh coolant', unit: '%' },
		points,
		target:
			input.targetFreshPercent === undefined
				? undefined
				: { label: 'Target', y: roundTo(input.targetFreshPercent, 1) }
	};
}
