import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import {
	CalculatorError,
	calculatorNames,
	calculatorResultSchema,
	calculators,
	drainFillInputSchema,
	runCalculator,
	type CalculatorName
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

/** One valid input per calculator, set in the invented demo shop's everyday work. */
const exampleInputs: Record<CalculatorName, unknown> = {
	'unit-conversion': { value: 16, from: 'psi', to: 'kPa' },
	'freeze-point': { glycol: 'EG', basis: 'volume', percent: 45 },
	'glycol-for-freeze-point': { glycol: 'PG', basis: 'volume', freezePointC: -25 },
	'mix-adjustment': {
		glycol: 'EG',
		capacityL: 9.5,
		currentFreezePointC: -18,
		targetFreezePointC: -37
	},
	'drain-and-fill': { capacityL: 10, drainL: 4, cycles: 2, targetFreshPercent: 80 },
	'boiling-point': {
		capGauge: { value: 110, unit: 'kPa' },
		altitudeM: 350,
		glycol: { type: 'EG', percent: 50, basis: 'volume' }
	},
	'service-interval': {
		lastChange: { kind: 'changed', date: '2022-04-12', odometerKm: 96_300 },
		currentDate: '2025-03-03',
		currentOdometerKm: 151_800
	}
};

describe('calculator registry', () => {
	it('lists every calculator with a title, a description, a schema and run', () => {
		expect(calculatorNames).toEqual([
			'unit-conversion',
			'freeze-point',
			'glycol-for-freeze-point',
			'mix-adjustment',
			'drain-and-fill',
			'boiling-point',
			'service-interval'
		]);
		for (const name of calculatorNames) {
			const entry = calculators[name];
			expect(entry.name).toBe(name);
			expect(entry.title.length).toBeGreaterThan(3);
			expect(entry.description).toMatch(/\.$/);
			expect(typeof entry.run).toBe('function');
		}
	});

	it.each(calculatorNames)(
		'runs %s and returns the shared result shape, every number with its unit',
		(name) => {
			const result = runCalculator(name, exampleInputs[name]);
			expect(calculatorResultSchema.safeParse(result).success).toBe(true);
			expect(result.basis.length).toBeGreaterThan(20);
			for (const [key, value] of Object.entries(result.values)) {
				expect(typeof value, `values.${key} is a bare number`).not.toBe('number');
				if (value !== null && typeof value === 'object') {
					expect(Number.isFinite(value.value)).toBe(true);
					expect(value.unit.length).toBeGreaterThan(0);
				}
			}
		}
	);

	it.each(calculatorNames)(
		'publishes %s’s input as JSON Schema for the OpenAPI document',
		(name) => {
			const schema = z.toJSONSchema(calculators[name].inputSchema, { io: 'input' });
			expect(schema.type).toBe('object');
			expect(schema.additionalProperties).toBe(false);
		}
	);

	it('publishes each number’s physical range in the JSON Schema', () => {
		const schema = z.toJSONSchema(calculators['drain-and-fill'].inputSchema, { io: 'input' }) as {
			properties: Record<string, { exclusiveMinimum?: number; minimum?: number; maximum?: number }>;
		};
		// Common practice, no source: no vehicle cooling system holds more than 1,000 L.
		expect(schema.properties.capacityL).toMatchObject({ exclusiveMinimum: 0, maximum: 1000 });
		expect(schema.properties.cycles).toMatchObject({ minimum: 1, maximum: 100 });
	});

	it('refuses an unknown calculator by name', () => {
		expectCalculatorError(
			() => runCalculator('tyre-pressure', {}),
			/There is no calculator called "tyre-pressure"/,
			'name'
		);
	});
});

describe('input validation messages', () => {
	it('says which field is missing or of the wrong kind', () => {
		const error = expectCalculatorError(
			() => runCalculator('drain-and-fill', { drainL: 'four' }),
			'System capacity is required.',
			'capacityL'
		);
		expect(error.issues).toContainEqual({
			path: 'drainL',
			message: 'Drain volume must be a number.'
		});
	});

	it('names a misspelt field instead of ignoring it', () => {
		expectCalculatorError(
			() => runCalculator('drain-and-fill', { capacity: 10, capacityL: 10, drainL: 4 }),
			'Unknown field: capacity.'
		);
	});

	it('reports the calculator’s own cross-field rule at its field', () => {
		const parsed = drainFillInputSchema.safeParse({ capacityL: 10, drainL: 12 });
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues).toEqual([
			expect.objectContaining({
				path: ['drainL'],
				message: 'Drain volume cannot be larger than the system capacity (10 L).'
			})
		]);
	});

	it('explains enum choices in words', () => {
		expectCalculatorError(
			() => runCalculator('freeze-point', { glycol: 'methanol', basis: 'volume', percent: 40 }),
			'Glycol must be "EG" (ethylene glycol) or "PG" (propylene glycol).',
			'glycol'
		);
		expectCalculatorError(
			() => runCalculator('boiling-point', { capGauge: { value: 15, unit: 'mmHg' } }),
			'Cap pressure unit must be one of: Pa, kPa, bar, psi, atm.',
			'capGauge.unit'
		);
		expectCalculatorError(
			() =>
				runCalculator('boiling-point', {
					capGauge: { value: 15, unit: 'psi' },
					glycol: { type: 'PG', percent: 40, basis: 'volume' }
				}),
			'The boiling estimate covers ethylene glycol ("EG") mixes only.'
		);
	});

	it('turns each calculator’s domain errors into the same error type, never a number', () => {
		const cases: [CalculatorName, unknown, RegExp][] = [
			['unit-conversion', { value: 3, from: 'L', to: 'psi' }, /Cannot convert litres/],
			['freeze-point', { glycol: 'EG', basis: 'volume', percent: 75 }, /gets worse, not better/],
			['glycol-for-freeze-point', { glycol: 'EG', basis: 'mass', freezePointC: 5 }, /above 0 °C/],
			[
				'mix-adjustment',
				{ glycol: 'EG', capacityL: 10, currentPercent: 40, targetFreezePointC: -70 },
				/more than 60 % glycol/
			],
			['drain-and-fill', { capacityL: 10, drainL: 4, cycles: 2.5 }, /whole number/],
			['boiling-point', { capGauge: { value: 40, unit: 'bar' } }, /check the unit/],
			[
				'service-interval',
				{ lastChange: { kind: 'sometime' }, currentDate: '2025-01-01', currentOdometerKm: 5 },
				/changed.*never/
			]
		];
		for (const [name, input, message] of cases) {
			expectCalculatorError(() => runCalculator(name, input), message);
		}
	});

	it('keeps every issue on the error for the API response', () => {
		let caught: unknown;
		try {
			runCalculator('mix-adjustment', {
				glycol: 'EG',
				capacityL: -1,
				currentPercent: 130,
				targetFreezePointC: 4
			});
		} catch (error) {
			caught = error;
		}
		expect(caught).toBeInstanceOf(CalculatorError);
		expect((caught as CalculatorError).issues.map((i) => i.path)).toEqual([
			'capacityL',
			'currentPercent',
			'targetFreezePointC'
		]);
	});
});

describe('module boundaries', () => {
	it('imports nothing but its own modules and zod (no SvelteKit, no server code)', () => {
		const folder = join(process.cwd(), 'src/lib/calculators');
		const files = readdirSync(folder).filter((f) => f.endsWith('.ts'));
		expect(files.length).toBeGreaterThanOrEqual(8);
		for (const file of files) {
			const source = readFileSync(join(folder, file), 'utf8');
			for (const match of source.matchAll(/from '([^']+)'/g)) {
				expect(match[1], `${file} imports ${match[1]}`).toMatch(/^(\.\/[a-z0-9-]+|zod)$/);
			}
		}
	});
});
