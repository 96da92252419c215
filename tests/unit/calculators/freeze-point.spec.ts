import { describe, expect, it } from 'vitest';
import {
	adjustMix,
	calculateFreezePoint,
	calculateGlycolForFreezePoint,
	convertGlycolVolumeToMassPercent,
	createMonotoneCubic,
	freezeTables,
	interpolateFreezePointC,
	interpolateGlycolPercent,
	type AdjustMixInput,
	type FreezeTableId
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

const egMass = freezeTables['eg-mass'];
const egVolume = freezeTables['eg-volume'];
const pgVolume = freezeTables['pg-volume'];

describe('ethylene glycol by mass: CRC Handbook of Chemistry and Physics, 102nd ed. (2021)', () => {
	// "Concentrative Properties of Aqueous Solutions: ethylene glycol", printed to 0.01 °C.
	const crc: [number, number][] = [
		[10, -3.37],
		[20, -7.93],
		[28, -13.03],
		[32, -16.23],
		[36, -19.82],
		[40, -23.84],
		[44, -28.32],
		[48, -33.3],
		[52, -38.81],
		[56, -44.83],
		[60, -51.23]
	];

	it.each(crc)('gives %d wt %% → %d °C as a table point', (percent, freezePointC) => {
		const result = calculateFreezePoint({ glycol: 'EG', basis: 'mass', percent });
		expect(result.values.freezePoint.value).toBeCloseTo(freezePointC, 2);
		expect(result.values.freezePoint.unit).toBe('°C');
		expect(result.values.interpolated).toBe(false);
		expect(result.basis).toMatch(/CRC Handbook/);
	});

	it('predicts each left-out CRC point from its neighbours within 0.25 °C', () => {
		// Leave-one-out: the curve never sees the point it predicts, so this measures how much
		// the interpolation itself can be off between printed points.
		const points = egMass.points;
		for (let i = 1; i < points.length - 1; i++) {
			const kept = points.filter((_, j) => j !== i);
			const curve = createMonotoneCubic(
				kept.map((p) => p.percent),
				kept.map((p) => p.freezePointC)
			);
			expect(Math.abs(curve.evaluate(points[i].percent) - points[i].freezePointC)).toBeLessThan(
				0.25
			);
		}
	});

	it('matches SciPy 1.17.1 PchipInterpolator on the same table between points', () => {
		// Reference values computed with scipy.interpolate.PchipInterpolator on the CRC points
		// plus 0 % → 0 °C, a general-purpose reference implementation of the same method.
		const scipy: [number, number][] = [
			[5, -1.547410939470366],
			[15, -5.465744093246125],
			[25, -10.95038428076527],
			[33.3, -17.351753568173052],
			[45, -29.516191328900774],
			[50, -35.98973629120205],
			[58, -47.98177334943639],
			[59.9, -51.065365207578495]
		];
		for (const [percent, expected] of scipy) {
			expect(interpolateFreezePointC(egMass, percent)).toBeCloseTo(expected, 9);
		}
	});
});

describe('commercial ethylene glycol antifreeze by volume', () => {
	it('gives the service publications’ points to the printed 1 °C', () => {
		// US Army TM 5-3895-382-24: 30 % → −15 °C, 50 % → −37 °C.
		// An equipment operator's manual, OMSU31337, coolant section:
		// 40 % → −24 °C, 50 % → −37 °C, 60 % → −52 °C.
		const published: [number, number][] = [
			[30, -15],
			[40, -24],
			[50, -37],
			[60, -52]
		];
		for (const [percent, freezePointC] of published) {
			const result = calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent });
			expect(Math.abs(result.values.freezePoint.value - freezePointC)).toBeLessThanOrEqual(0.5);
		}
	});

	it('stays within 3 °C of the Engineering ToolBox table, the spread between published tables', () => {
		// Engineering ToolBox, "Ethylene Glycol Heat-Transfer Fluid" (vol %): it gives 60 % → −55 °C
		// where the operator's manual gives −52 °C, so 3 °C is the disagreement of the sources.
		const toolbox: [number, number][] = [
			[10, -3],
			[20, -8],
			[30, -16],
			[40, -25],
			[50, -37],
			[60, -55]
		];
		for (const [percent, freezePointC] of toolbox) {
			expect(
				Math.abs(interpolateFreezePointC(egVolume, percent) - freezePointC)
			).toBeLessThanOrEqual(3);
		}
	});

	it('agrees with the pure-EG mass table within 3.5 °C after converting volume to mass', () => {
		// Independent sources: commercial concentrate carries a few % of additives and water,
		// so it freezes a little higher than pure EG at the same nominal strength.
		for (const percent of [30, 40, 50]) {
			const viaMass = interpolateFreezePointC(egMass, convertGlycolVolumeToMassPercent(percent));
			const commercial = interpolateFreezePointC(egVolume, percent);
			expect(viaMass).toBeLessThan(commercial);
			expect(commercial - viaMass).toBeLessThan(3.5);
		}
	});

	it('says which table was used and that the answer between points is interpolated', () => {
		const result = calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent: 45 });
		expect(result.values.table).toBe('eg-volume');
		expect(result.values.interpolated).toBe(true);
		expect(result.values.concentration).toEqual({ value: 45, unit: 'vol %' });
		expect(result.basis).toMatch(/US Army TM 5-3895-382-24/);
		expect(result.basis).toMatch(/interpolated with a monotone cubic \(PCHIP\)/);
		expect(result.steps?.join(' ')).toMatch(
			/between the table points 40 % \(−24 °C\) and 50 % \(−37 °C\)/
		);
		expect(result.values.freezePoint.value).toBeLessThan(-24);
		expect(result.values.freezePoint.value).toBeGreaterThan(-37);
	});
});

describe("propylene glycol by volume: Lange's Handbook of Chemistry, Table 5.13", () => {
	const lange: [number, number][] = [
		[10, -2.2],
		[20, -6.7],
		[30, -12.8],
		[40, -20.6],
		[50, -33.3]
	];

	it.each(lange)('gives %d vol %% → %d °C to the printed 0.1 °C', (percent, freezePointC) => {
		const result = calculateFreezePoint({ glycol: 'PG', basis: 'volume', percent });
		expect(result.values.freezePoint.value).toBeCloseTo(freezePointC, 1);
		expect(result.basis).toMatch(/Lange's Handbook/);
	});

	it('matches SciPy 1.17.1 PchipInterpolator between points', () => {
		expect(interpolateFreezePointC(pgVolume, 25)).toBeCloseTo(-9.541650264693907, 9);
		expect(interpolateFreezePointC(pgVolume, 45)).toBeCloseTo(-26.264298780487806, 9);
	});
});

describe('interpolation shape', () => {
	const tableIds: FreezeTableId[] = ['eg-mass', 'eg-volume', 'pg-volume'];

	it('falls steadily between table points and never overshoots them', () => {
		for (const id of tableIds) {
			const table = freezeTables[id];
			let previous = Infinity;
			const max = table.points[table.points.length - 1].percent;
			for (let percent = 0; percent <= max; percent += 0.25) {
				const value = interpolateFreezePointC(table, percent);
				expect(value).toBeLessThan(previous);
				const upper = table.points.findIndex((p) => p.percent >= percent);
				const a = table.points[Math.max(0, upper - 1)];
				const b = table.points[upper];
				expect(value).toBeLessThanOrEqual(Math.max(a.freezePointC, b.freezePointC) + 1e-12);
				expect(value).toBeGreaterThanOrEqual(Math.min(a.freezePointC, b.freezePointC) - 1e-12);
				previous = value;
			}
		}
	});

	it('reproduces a straight line exactly and rejects x values that do not increase', () => {
		const line = createMonotoneCubic([0, 1, 3, 4], [1, 3, 7, 9]);
		expect(line.evaluate(2.5)).toBeCloseTo(6, 12);
		expect(line.invert(8)).toBeCloseTo(3.5, 12);
		expect(() => createMonotoneCubic([0, 2, 2], [0, 1, 2])).toThrow(/increase strictly/);
		expect(() => line.evaluate(4.01)).toThrow(RangeError);
	});
});

describe('round trips', () => {
	it('returns a freeze point after going to a concentration and back', () => {
		for (const id of ['eg-mass', 'eg-volume', 'pg-volume'] as const) {
			const table = freezeTables[id];
			const lowest = table.points[table.points.length - 1].freezePointC;
			for (let freezePointC = 0; freezePointC >= lowest; freezePointC -= 1.7) {
				const percent = interpolateGlycolPercent(table, freezePointC);
				expect(interpolateFreezePointC(table, percent)).toBeCloseTo(freezePointC, 9);
			}
		}
	});

	it('returns a concentration after going to a freeze point and back', () => {
		for (const percent of [0, 3, 12.5, 27, 33.3, 44, 49.9]) {
			const freezePointC = interpolateFreezePointC(pgVolume, percent);
			expect(interpolateGlycolPercent(pgVolume, freezePointC)).toBeCloseTo(percent, 9);
		}
	});

	it('answers the reverse question through the calculator: −37 °C needs 50 vol % (US Army TM 5-3895-382-24)', () => {
		const result = calculateGlycolForFreezePoint({
			glycol: 'EG',
			basis: 'volume',
			freezePointC: -37
		});
		expect(result.values.concentration).toEqual({ value: 50, unit: 'vol %' });
		expect(result.values.interpolated).toBe(false);
	});
});

describe('strength warnings', () => {
	it('warns near 60 % that more glycol protects less (US Army TM 5-6115-400-12)', () => {
		const result = calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent: 58 });
		expect(result.warnings.join(' ')).toMatch(/protects less against freezing, not more/);
		expect(result.warnings.join(' ')).toMatch(/TM 5-6115-400-12/);
	});

	it('gives no strength warning for a 50 % mix', () => {
		expect(calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent: 50 }).warnings).toEqual(
			[]
		);
	});

	it('carries the poison caution', () => {
		const result = calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent: 50 });
		expect(result.cautions.join(' ')).toMatch(/poisonous to people and animals/);
	});
});

describe('freeze point errors', () => {
	it('rejects a concentration below 0 or above 100 %', () => {
		for (const percent of [-1, 100.5, 250]) {
			expectCalculatorError(
				() => calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent }),
				'Glycol concentration must be between 0 and 100 %.',
				'percent'
			);
		}
	});

	it('refuses to extrapolate above 60 % and says protection gets worse there', () => {
		expectCalculatorError(
			() => calculateFreezePoint({ glycol: 'EG', basis: 'volume', percent: 70 }),
			'No freeze point for 70 % ethylene glycol by volume: the table covers 0–60 %. Above about 60 % glycol the freeze protection gets worse, not better: do not exceed 60 %.',
			'percent'
		);
	});

	it('refuses a propylene glycol mix beyond its table without the 60 % sentence', () => {
		expectCalculatorError(
			() => calculateFreezePoint({ glycol: 'PG', basis: 'volume', percent: 55 }),
			'No freeze point for 55 % propylene glycol by volume: the table covers 0–50 %.'
		);
	});

	it('has no propylene glycol table by mass', () => {
		expectCalculatorError(
			() => calculateFreezePoint({ glycol: 'PG', basis: 'mass', percent: 40 }),
			/no propylene glycol freeze-point table by mass/,
			'basis'
		);
	});

	it('rejects a freeze point above 0 °C and one no mix in the table reaches', () => {
		expectCalculatorError(
			() => calculateGlycolForFreezePoint({ glycol: 'EG', basis: 'volume', freezePointC: 2 }),
			'A freeze point above 0 °C is not possible: water alone freezes at 0 °C.',
			'freezePointC'
		);
		expectCalculatorError(
			() => calculateGlycolForFreezePoint({ glycol: 'EG', basis: 'volume', freezePointC: -60 }),
			'No mix in the table (commercial ethylene glycol antifreeze in water, % by volume) freezes as low as −60 °C: its strongest mix, 60 %, freezes at −52 °C. More glycol than about 60 % protects less, not more.'
		);
	});

	it('rejects a concentration that is not a number', () => {
		expectCalculatorError(
			() => calculateFreezePoint({ glycol: 'EG', basis: 'mass', percent: Number.NaN }),
			'Concentration must be a number.'
		);
	});
});

function makeAdjustInput(overrides: Partial<AdjustMixInput> = {}): AdjustMixInput {
	return { glycol: 'EG', capacityL: 10, targetFreezePointC: -37, ...overrides };
}

describe('adjustMix', () => {
	it('drains 2.86 L of a 10 L system at −15 °C (30 %) and adds concentrate to reach −37 °C (50 %)', () => {
		// Table points: 30 % → −15 °C and 50 % → −37 °C (US Army TM 5-3895-382-24).
		// x = V (ct − c0) / (100 − c0) = 10 × 20 / 70.
		const result = adjustMix(makeAdjustInput({ currentFreezePointC: -15 }));
		expect(result.values.currentConcentration).toEqual({ value: 30, unit: 'vol %' });
		expect(result.values.targetConcentration).toEqual({ value: 50, unit: 'vol %' });
		expect(result.values.drain).toEqual({ value: 2.86, unit: 'L' });
		expect(result.values.add).toEqual({ value: 2.86, unit: 'L' });
		expect(result.values.addFluid).toBe('concentrate');
		expect(result.steps?.join(' ')).toMatch(/Drain = 10 L × \(50 − 30\) \/ \(100 − 30\) = 2.86 L/);
	});

	it('leaves a mix that, by glycol balance, lands on the target', () => {
		for (const currentPercent of [0, 12, 25, 41, 58, 65, 80]) {
			for (const targetFreezePointC of [-5, -20, -37, -50]) {
				for (const refillPercent of [100, 60]) {
					const input = makeAdjustInput({
						capacityL: 13.5,
						currentPercent,
						targetFreezePointC,
						refillPercent
					});
					const targetPercent = interpolateGlycolPercent(egVolume, targetFreezePointC);
					if (targetPercent > currentPercent && refillPercent <= targetPercent) continue;
					const result = adjustMix(input);
					const drainL = result.values.drain.value;
					const added = result.values.addFluid === 'water' ? 0 : refillPercent;
					const mixed = (currentPercent * (13.5 - drainL) + added * drainL) / 13.5;
					// Drain volumes are reported to 0.01 L, which moves the mix by under 0.1 %.
					expect(Math.abs(mixed - targetPercent)).toBeLessThan(0.1);
				}
			}
		}
	});

	it('dilutes a mix that is too strong with water and says why', () => {
		const result = adjustMix(makeAdjustInput({ currentPercent: 70 }));
		expect(result.values.addFluid).toBe('water');
		// x = V (c0 − ct) / c0 = 10 × 20 / 70.
		expect(result.values.drain.value).toBeCloseTo(2.86, 2);
		expect(result.values.currentFreezePoint).toBeNull();
		expect(result.warnings.join(' ')).toMatch(/above 60 % glycol: it protects less/);
	});

	it('uses a premixed refill when asked: 30 % to 40 % with a 50 % premix drains half', () => {
		const result = adjustMix(
			makeAdjustInput({ currentPercent: 30, targetFreezePointC: -24, refillPercent: 50 })
		);
		expect(result.values.addFluid).toBe('premix');
		expect(result.values.drain.value).toBeCloseTo(5, 2);
	});

	it('asks for nothing when the mix is already on target', () => {
		const result = adjustMix(makeAdjustInput({ currentPercent: 50 }));
		expect(result.values.drain).toEqual({ value: 0, unit: 'L' });
		expect(result.values.addFluid).toBe('none');
	});

	it('carries the hot-cap and poison cautions', () => {
		const result = adjustMix(makeAdjustInput({ currentPercent: 40 }));
		expect(result.cautions.join(' ')).toMatch(/Never open a hot, pressurised cap/);
		expect(result.cautions.join(' ')).toMatch(/approved collection point/);
	});

	it('rejects a target that would need more than 60 % glycol', () => {
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentPercent: 40, targetFreezePointC: -60 })),
			'Protection to −60 °C would need more than 60 % glycol, and more glycol than that protects less, not more. Choose a target of −52 °C or warmer.',
			'targetFreezePointC'
		);
	});

	it('rejects a refill too weak to reach the target, which would mean draining more than the system', () => {
		expectCalculatorError(
			() =>
				adjustMix(
					makeAdjustInput({ currentPercent: 40, targetFreezePointC: -45, refillPercent: 50 })
				),
			/A 50 % refill cannot bring the mix up to 55.5 %: you would have to drain more than the whole system \(10 L\)/,
			'refillPercent'
		);
	});

	it('rejects a missing, doubled or impossible current reading', () => {
		expectCalculatorError(
			() => adjustMix(makeAdjustInput()),
			'Give the current mix: its measured freeze point or its concentration.'
		);
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentPercent: 30, currentFreezePointC: -15 })),
			'Give the current mix either as a concentration or as a measured freeze point, not both.'
		);
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentFreezePointC: 3 })),
			/above 0 °C is not possible/,
			'currentFreezePointC'
		);
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentPercent: 120 })),
			'Glycol concentration must be between 0 and 100 %.',
			'currentPercent'
		);
	});

	it('rejects an empty system, a target above 0 °C and a refill without glycol', () => {
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ capacityL: 0, currentPercent: 30 })),
			'System capacity must be more than 0 L.',
			'capacityL'
		);
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentPercent: 30, targetFreezePointC: 1 })),
			/target freeze point above 0 °C is not possible/
		);
		expectCalculatorError(
			() => adjustMix(makeAdjustInput({ currentPercent: 30, refillPercent: 0 })),
			/more than 0 % and at most 100 % glycol/
		);
	});
});
