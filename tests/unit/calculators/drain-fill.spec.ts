import { describe, expect, it } from 'vitest';
import {
	calculateDrainFill,
	findCyclesNeeded,
	findFreshFraction
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

describe('fresh share after partial drain-and-fill cycles', () => {
	it('renews 40 % per cycle when 4 L come out of a 10 L system (common practice, no source)', () => {
		expect(findFreshFraction(10, 4, 1)).toBeCloseTo(0.4, 12);
		const result = calculateDrainFill({ capacityL: 10, drainL: 4 });
		expect(result.values.renewedPerCycle).toEqual({ value: 40, unit: '%' });
		expect(result.values.freshAfterCycles).toEqual({ value: 40, unit: '%' });
	});

	it('follows 1 − (1 − d/V)^n over several cycles', () => {
		// 1 − 0.6² = 0.64 and 1 − 0.6³ = 0.784, worked by hand.
		expect(findFreshFraction(10, 4, 2)).toBeCloseTo(0.64, 12);
		expect(findFreshFraction(10, 4, 3)).toBeCloseTo(0.784, 12);
		expect(findFreshFraction(10, 4, 0)).toBe(0);
		expect(findFreshFraction(8, 8, 1)).toBe(1);
	});

	it('never falls as cycles are added', () => {
		let previous = -1;
		for (let n = 0; n <= 30; n++) {
			const fraction = findFreshFraction(12.5, 3.2, n);
			expect(fraction).toBeGreaterThan(previous);
			expect(fraction).toBeLessThan(1);
			previous = fraction;
		}
	});
});

describe('cycles needed for a target share', () => {
	it('needs 5 cycles of 4 L from 10 L to pass 90 % (87.0 % after 4, 92.2 % after 5)', () => {
		expect(findCyclesNeeded(10, 4, 0.9)).toBe(5);
		const result = calculateDrainFill({ capacityL: 10, drainL: 4, targetFreshPercent: 90 });
		expect(result.values.cyclesNeeded).toEqual({ value: 5, unit: 'cycles' });
		expect(result.values.freshAfterCyclesNeeded).toEqual({ value: 92.2, unit: '%' });
		expect(result.values.coolantNeeded).toEqual({ value: 20, unit: 'L' });
	});

	it('does not add a cycle when the target is met exactly despite rounding', () => {
		// 1 − 0.5² = 0.75 and 1 − 0.6³ = 0.784 exactly on paper; floating point must not cost a cycle.
		expect(findCyclesNeeded(10, 5, 0.75)).toBe(2);
		expect(findCyclesNeeded(10, 4, 0.784)).toBe(3);
		expect(findCyclesNeeded(10, 4, 0.4)).toBe(1);
	});

	it('gives the fewest cycles that reach the target over a grid of cases', () => {
		for (const drainL of [0.5, 1, 2.5, 4, 7, 9.9]) {
			for (const target of [0.05, 0.3, 0.5, 0.8, 0.95, 0.99]) {
				const cycles = findCyclesNeeded(10, drainL, target);
				expect(findFreshFraction(10, drainL, cycles)).toBeGreaterThanOrEqual(target - 1e-12);
				expect(findFreshFraction(10, drainL, cycles - 1)).toBeLessThan(target);
			}
		}
	});

	it('needs no cycle for a 0 % target and one full drain for 100 %', () => {
		expect(findCyclesNeeded(10, 4, 0)).toBe(0);
		expect(findCyclesNeeded(10, 10, 1)).toBe(1);
	});
});

describe('drain-and-fill errors', () => {
	it('rejects a drain larger than the system', () => {
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 12 }),
			'Drain volume cannot be larger than the system capacity (10 L).',
			'drainL'
		);
	});

	it('rejects negative volumes and an empty system', () => {
		expectCalculatorError(
			() => findFreshFraction(10, -1, 1),
			'Drain volume cannot be negative.',
			'drainL'
		);
		expectCalculatorError(
			() => findFreshFraction(-10, 1, 1),
			'System capacity must be more than 0 L.',
			'capacityL'
		);
		expectCalculatorError(
			() => findFreshFraction(0, 0, 1),
			'System capacity must be more than 0 L.'
		);
	});

	it('rejects a target when nothing is drained', () => {
		expectCalculatorError(
			() => findCyclesNeeded(10, 0, 0.5),
			'Draining 0 L renews nothing: give the volume that comes out.',
			'drainL'
		);
	});

	it('rejects a 100 % target for a partial drain', () => {
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 4, targetFreshPercent: 100 }),
			/never reaches 100 % fresh coolant/,
			'targetFreshPercent'
		);
	});

	it('rejects a target outside 0–100 % and one that would take over 100 cycles', () => {
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 4, targetFreshPercent: 120 }),
			'Target share of fresh coolant must be between 0 and 100 %.'
		);
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 0.01, targetFreshPercent: 99 }),
			/more than 100 cycles/
		);
	});

	it('rejects a fractional or negative number of cycles', () => {
		for (const cycles of [1.5, -1]) {
			expectCalculatorError(
				() => findFreshFraction(10, 4, cycles),
				'Number of cycles must be a whole number from 1 to 100.',
				'cycles'
			);
		}
	});

	it('refuses 0 cycles and a 0 % target as input: they renew nothing', () => {
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 4, cycles: 0 }),
			'Number of cycles must be a whole number from 1 to 100.',
			'cycles'
		);
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 4, targetFreshPercent: 0 }),
			'Target share of fresh coolant must be more than 0 %.',
			'targetFreshPercent'
		);
	});

	it('refuses a capacity no cooling system has, with a message at the field', () => {
		for (const capacityL of [1e17, 1e21, 1e308]) {
			expectCalculatorError(
				() => calculateDrainFill({ capacityL, drainL: 1, targetFreshPercent: 80 }),
				/at most 1,000 L: no vehicle cooling system holds more/,
				'capacityL'
			);
		}
	});

	it('refuses a drain too small to reach a target within 100 cycles instead of counting forever', () => {
		// 1e-300 L of 10 L: log(1 − d/V) rounds to 0 without log1p, which once made the count endless.
		expectCalculatorError(
			() => calculateDrainFill({ capacityL: 10, drainL: 1e-300, targetFreshPercent: 80 }),
			/more than 100 cycles/,
			'targetFreshPercent'
		);
		expectCalculatorError(
			() => findCyclesNeeded(1000, 1e-13, 0.8),
			/more than 100 cycles/,
			'targetFreshPercent'
		);
	});
});

describe('drain-and-fill result', () => {
	it('shows the working and the cautions', () => {
		const result = calculateDrainFill({ capacityL: 10, drainL: 4, cycles: 3 });
		expect(result.values.freshAfterCycles).toEqual({ value: 78.4, unit: '%' });
		expect(result.values.coolantNeeded).toEqual({ value: 12, unit: 'L' });
		expect(result.steps?.join(' ')).toMatch(/1 − \(1 − 0\.4\)\^3 = 78\.4 % fresh coolant/);
		expect(result.cautions.join(' ')).toMatch(/Never open a hot, pressurised cap/);
		expect(result.cautions.join(' ')).toMatch(/approved collection point/);
	});
});
