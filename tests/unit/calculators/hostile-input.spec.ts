import { spawnSync } from 'node:child_process';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	CalculatorError,
	calculatorNames,
	calculatorResultSchema,
	calculators,
	MAX_CYCLES,
	pressureUnits,
	runCalculator,
	type CalculatorName,
	type CalculatorResult
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

/** Fixed so that a failure can be replayed; bounded so the suite stays fast. */
const SEED = 20_261_202;
const RUNS_PER_CALCULATOR = 400;
/** Every calculator answers in well under a millisecond; this only catches a runaway loop. */
const MAX_MS_PER_CALL = 250;

const hostileNumbers = [
	1e308,
	-1e308,
	1e21,
	1e17,
	1e12,
	1e-9,
	1e-300,
	-1e-300,
	0,
	-0,
	Number.MAX_VALUE,
	Number.MIN_VALUE,
	Number.MAX_SAFE_INTEGER,
	Number.NaN,
	Number.POSITIVE_INFINITY,
	Number.NEGATIVE_INFINITY
];

const number = fc.oneof(
	fc.constantFrom(...hostileNumbers),
	fc.double(),
	fc.double({ min: -300, max: 300, noNaN: true }),
	fc.integer({ min: -10, max: 200_000 })
);

const prototypeKeys = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'prototype'];
const text = fc.oneof(
	fc.constantFrom(...prototypeKeys, '', ' ', '\u0000', 'gal', 'psi', 'L', 'US gal', '°C', 'K'),
	fc.string({ maxLength: 30 })
);
const date = fc.oneof(
	fc
		.tuple(
			fc.integer({ min: 0, max: 9999 }),
			fc.integer({ min: 0, max: 13 }),
			fc.integer({ min: 0, max: 32 })
		)
		.map(
			([y, m, d]) =>
				`${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`
		),
	fc.constantFrom('1900-01-01', '2199-12-31', '2024-02-29', '2023-02-29', '9999-12-31'),
	text
);
/** Now and then a value of the wrong kind altogether. */
const anything = fc.oneof(fc.constantFrom(null, true, [], {}), text, number);
const orWrong = <T>(arb: fc.Arbitrary<T>) =>
	fc.oneof({ weight: 6, arbitrary: arb }, { weight: 1, arbitrary: anything });
const partial = <T extends Record<string, fc.Arbitrary<unknown>>>(shape: T) =>
	fc.record(shape, { requiredKeys: [] });

const glycol = orWrong(fc.constantFrom('EG', 'PG'));
const basis = orWrong(fc.constantFrom('mass', 'volume'));
const unit = orWrong(
	fc.constantFrom(
		'L',
		'US qt',
		'US gal',
		'UK gal',
		'kPa',
		'psi',
		'bar',
		'N·m',
		'lbf·ft',
		'°C',
		'°F',
		'K'
	)
);

const inputs: Record<CalculatorName, fc.Arbitrary<unknown>> = {
	'unit-conversion': partial({ value: orWrong(number), from: orWrong(unit), to: orWrong(unit) }),
	'freeze-point': partial({ glycol, basis, percent: orWrong(number) }),
	'glycol-for-freeze-point': partial({ glycol, basis, freezePointC: orWrong(number) }),
	'mix-adjustment': partial({
		glycol,
		capacityL: orWrong(number),
		currentPercent: orWrong(number),
		currentFreezePointC: orWrong(number),
		targetFreezePointC: orWrong(number),
		refillPercent: orWrong(number)
	}),
	'drain-and-fill': partial({
		capacityL: orWrong(number),
		drainL: orWrong(number),
		cycles: orWrong(number),
		targetFreshPercent: orWrong(number)
	}),
	'boiling-point': partial({
		capGauge: orWrong(
			partial({ value: orWrong(number), unit: orWrong(fc.constantFrom(...pressureUnits)) })
		),
		altitudeM: orWrong(number),
		glycol: orWrong(partial({ type: orWrong(fc.constant('EG')), percent: orWrong(number), basis }))
	}),
	'service-interval': partial({
		lastChange: orWrong(
			fc.oneof(
				partial({ kind: fc.constant('changed'), date, odometerKm: orWrong(number) }),
				partial({ kind: fc.constant('never'), inServiceDate: date })
			)
		),
		currentDate: date,
		currentOdometerKm: orWrong(number),
		averageKmPerDay: orWrong(number),
		settings: orWrong(
			partial({
				firstChangeKm: orWrong(number),
				thenEveryKm: orWrong(number),
				everyMonths: orWrong(number),
				dueSoonDays: orWrong(number),
				dueSoonKm: orWrong(number)
			})
		)
	})
};

/** Input within the ranges with one field now and then pushed to a hostile value. */
const near = (low: number, high: number) =>
	fc.oneof(
		{ weight: 8, arbitrary: fc.double({ min: low, max: high, noNaN: true }) },
		{ weight: 1, arbitrary: number }
	);
const realDate = fc
	.date({
		min: new Date('1900-01-01T00:00:00Z'),
		max: new Date('2199-12-31T00:00:00Z'),
		noInvalidDate: true
	})
	.map((d) => d.toISOString().slice(0, 10));
const plausible: Partial<Record<CalculatorName, fc.Arbitrary<unknown>>> = {
	'drain-and-fill': fc.record(
		{
			capacityL: near(0, 1_000),
			drainL: near(0, 1_000),
			cycles: fc.oneof(fc.integer({ min: 0, max: 120 }), number),
			targetFreshPercent: near(0, 100)
		},
		{ requiredKeys: ['capacityL', 'drainL'] }
	),
	'service-interval': fc.record(
		{
			lastChange: fc.oneof(
				fc.record({ kind: fc.constant('changed'), date: realDate, odometerKm: near(0, 1e7) }),
				fc.record({ kind: fc.constant('never'), inServiceDate: realDate })
			),
			currentDate: realDate,
			currentOdometerKm: near(0, 1e7),
			averageKmPerDay: near(0, 2_000)
		},
		{ requiredKeys: ['lastChange', 'currentDate', 'currentOdometerKm'] }
	)
};
const inputFor = (name: CalculatorName) => {
	const close = plausible[name];
	return close ? fc.oneof(inputs[name], close) : inputs[name];
};

/** Every number in the values must be finite: JSON would carry Infinity or NaN as null. */
function expectFiniteValues(result: CalculatorResult): void {
	expect(calculatorResultSchema.safeParse(result).success).toBe(true);
	for (const [key, value] of Object.entries(result.values)) {
		if (value !== null && typeof value === 'object') {
			expect(Number.isFinite(value.value), `values.${key} = ${value.value}`).toBe(true);
		}
	}
	expect(JSON.stringify(result)).not.toMatch(/"value":null/);
}

describe('every calculator under random and hostile input (fast-check)', () => {
	it.each(calculatorNames)(
		'%s answers a result with finite numbers or refuses with a CalculatorError, never anything else',
		(name) => {
			let answered = 0;
			fc.assert(
				fc.property(inputFor(name), (input) => {
					const started = performance.now();
					let result: CalculatorResult | undefined;
					try {
						result = calculators[name].run(input);
					} catch (error) {
						expect(error).toBeInstanceOf(CalculatorError);
						expect((error as CalculatorError).issues.length).toBeGreaterThan(0);
					}
					expect(performance.now() - started).toBeLessThan(MAX_MS_PER_CALL);
					if (result) {
						answered++;
						expectFiniteValues(result);
						const cycles = result.values.cyclesNeeded;
						if (cycles && typeof cycles === 'object') {
							expect(cycles.value).toBeLessThanOrEqual(MAX_CYCLES);
						}
					}
				}),
				{ seed: SEED, numRuns: RUNS_PER_CALCULATOR }
			);
			// Random input is mostly refused; the property must still reach the arithmetic.
			expect(answered, `${name}: no generated input got past validation`).toBeGreaterThan(0);
		}
	);
});

describe('inputs that once broke a calculator', () => {
	it('refuses ±1e308 with an issue at the field instead of answering null', () => {
		const cases: [CalculatorName, unknown, string][] = [
			['unit-conversion', { value: 1e308, from: 'psi', to: 'kPa' }, 'value'],
			['unit-conversion', { value: -1e308, from: 'N·m', to: 'lbf·ft' }, 'value'],
			['drain-and-fill', { capacityL: 1e308, drainL: 1e308 }, 'capacityL'],
			[
				'mix-adjustment',
				{ glycol: 'EG', capacityL: 1e308, currentPercent: 30, targetFreezePointC: -37 },
				'capacityL'
			],
			[
				'glycol-for-freeze-point',
				{ glycol: 'EG', basis: 'mass', freezePointC: -1e308 },
				'freezePointC'
			],
			['boiling-point', { capGauge: { value: 1e308, unit: 'psi' } }, 'capGauge.value'],
			[
				'service-interval',
				{
					lastChange: { kind: 'never', inServiceDate: '2020-01-01' },
					currentDate: '2024-01-01',
					currentOdometerKm: 1e308
				},
				'currentOdometerKm'
			]
		];
		for (const [name, input, path] of cases) {
			const error = expectCalculatorError(() => runCalculator(name, input), /./);
			expect(
				error.issues.map((issue) => issue.path),
				`${name} ${JSON.stringify(input)}`
			).toContain(path);
		}
	});

	it('reads "__proto__" and "constructor" as unknown units, not as an object’s own machinery', () => {
		for (const unit of ['__proto__', 'constructor', 'toString']) {
			expectCalculatorError(
				() => runCalculator('unit-conversion', { value: 1, from: unit, to: 'kPa' }),
				new RegExp(`Unknown unit "${unit}"`),
				'from'
			);
			expectCalculatorError(
				() => runCalculator('unit-conversion', { value: 1, from: 'kPa', to: unit }),
				new RegExp(`Unknown unit "${unit}"`),
				'to'
			);
		}
	});

	it('refuses an odometer of 1e12 km and answers 1e-9 km a day without an invalid date', () => {
		expectCalculatorError(
			() =>
				runCalculator('service-interval', {
					lastChange: { kind: 'changed', date: '2020-01-01', odometerKm: 1e12 },
					currentDate: '2024-01-01',
					currentOdometerKm: 1e12
				}),
			/must be between 0 and 9,999,999 km/,
			'lastChange.odometerKm'
		);
		const result = runCalculator('service-interval', {
			lastChange: { kind: 'changed', date: '2020-01-01', odometerKm: 100_000 },
			currentDate: '2024-01-01',
			currentOdometerKm: 140_000,
			averageKmPerDay: 1e-9
		});
		// Common practice, no source: 60 months from 2020-01-01 is 2025-01-01.
		expect(result.values.dueDate).toBe('2025-01-01');
		expect(result.values.distanceDueDate).toBeNull();
		expect(result.values.firstLimit).toBe('time');
		expect(result.warnings.join(' ')).toMatch(/more than 100 years away/);
	});

	it('refuses odometer readings that imply more than 2,000 km a day', () => {
		expectCalculatorError(
			() =>
				runCalculator('service-interval', {
					lastChange: { kind: 'changed', date: '2024-01-01', odometerKm: 0 },
					currentDate: '2024-03-01',
					currentOdometerKm: 9_000_000
				}),
			/km a day, more than the 2,000 km a vehicle can cover/,
			'currentOdometerKm'
		);
	});

	// Run in a child process with a time limit: an endless loop here would otherwise stop the
	// whole test run instead of failing this test.
	it('answers the drain-and-fill inputs that once looped forever, in a separate process with a time limit', () => {
		const cases = [
			{ capacityL: 1e17, drainL: 1, targetFreshPercent: 80 },
			{ capacityL: 1e21, drainL: 1, targetFreshPercent: 80 },
			{ capacityL: 1e308, drainL: 1, targetFreshPercent: 80 },
			{ capacityL: 10, drainL: 1e-300, targetFreshPercent: 80 },
			{ capacityL: 1000, drainL: 1e-13, targetFreshPercent: 80 }
		];
		const script = `
			const { runCalculator } = await import('./src/lib/calculators/index.ts');
			const outcomes = ${JSON.stringify(cases)}.map((input) => {
				try { return { answered: runCalculator('drain-and-fill', input) }; }
				catch (error) { return { refused: error.name, path: error.path }; }
			});
			process.stdout.write(JSON.stringify(outcomes));`;
		const child = spawnSync(
			process.execPath,
			['--import', 'tsx', '--input-type=module', '-e', script],
			{ cwd: process.cwd(), encoding: 'utf8', timeout: 30_000 }
		);
		expect(child.error?.message, 'the calculator did not finish within 30 s').toBeUndefined();
		expect(child.status, child.stderr).toBe(0);
		const outcomes = JSON.parse(child.stdout) as { refused?: string; path?: string }[];
		expect(outcomes.map((o) => [o.refused, o.path])).toEqual([
			['CalculatorError', 'capacityL'],
			['CalculatorError', 'capacityL'],
			['CalculatorError', 'capacityL'],
			['CalculatorError', 'targetFreshPercent'],
			['CalculatorError', 'targetFreshPercent']
		]);
	});
});
