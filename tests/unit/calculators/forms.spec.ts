import { describe, expect, it } from 'vitest';
import {
	buildFormSchema,
	calculatorForms,
	checkNumberText,
	leafFields,
	readFormNumber
} from '../../../src/lib/calculator-forms';
import {
	boilingPointUnderCap,
	convertPressure,
	formatSignificant,
	runCalculator
} from '../../../src/lib/calculators';

describe('numbers as a person types them', () => {
	it('reads a decimal comma as a decimal point: 50,5 is 50.5, never 505', () => {
		expect(readFormNumber('50,5')).toBe(50.5);
		expect(readFormNumber('50.5')).toBe(50.5);
		expect(readFormNumber(' 0,125 ')).toBe(0.125);
		expect(readFormNumber('−37')).toBe(-37);
		expect(readFormNumber('')).toBeUndefined();
	});

	it('refuses what is not a number with a message that says so', () => {
		expect(checkNumberText('forty', 'Drain volume')).toBe(
			'Drain volume must be a number, such as 50.5 or 50,5 (no letters or units).'
		);
		expect(checkNumberText('4 L', 'Drain volume')).toMatch(/must be a number/);
		expect(checkNumberText('1e17', 'Capacity')).toMatch(/must be a number/);
		expect(readFormNumber('forty')).toBeNaN();
	});

	it('asks about a comma that could group thousands instead of guessing', () => {
		expect(checkNumberText('1,500', 'Capacity')).toMatch(/could mean 1\.500 or 1500/);
		expect(readFormNumber('1,500')).toBeNaN();
	});
});

describe('form definitions', () => {
	it('defines every calculator once, each field name once', () => {
		expect(calculatorForms.map((f) => f.calculator)).toEqual([
			'freeze-point',
			'glycol-for-freeze-point',
			'mix-adjustment',
			'drain-and-fill',
			'boiling-point',
			'service-interval',
			'unit-conversion'
		]);
		for (const form of calculatorForms) {
			const names = leafFields(form.fields).flatMap((f) =>
				f.kind === 'number' && f.unit ? [f.name, f.unit.name] : [f.name]
			);
			expect(new Set(names).size, form.calculator).toBe(names.length);
			// Every issue path the form can place points at one of its own fields.
			for (const field of Object.values(form.fieldOf)) expect(names).toContain(field);
		}
	});

	it('refuses a choice that is not on the list, such as "__proto__"', () => {
		const conversion = calculatorForms.find((f) => f.calculator === 'unit-conversion')!;
		const parsed = buildFormSchema(conversion.fields).safeParse({
			value: '1',
			from: '__proto__',
			to: 'kPa'
		});
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues[0].path).toEqual(['from']);
	});

	it('gives the defaults of every form a result', () => {
		const context = {
			today: '2025-03-03',
			intervals: {
				firstChangeKm: 160_000,
				thenEveryKm: 80_000,
				everyMonths: 60,
				dueSoonDays: 30,
				dueSoonKm: 2_000
			}
		};
		for (const form of calculatorForms) {
			const values = {
				...form.defaults(context),
				...(form.calculator === 'service-interval'
					? {
							lastChangeDate: '2022-04-12',
							lastChangeOdometerKm: '96300',
							currentOdometerKm: '151800'
						}
					: {})
			};
			const { input, errors } = form.toInput(values);
			expect(errors).toEqual({});
			const rows = form.present(runCalculator(form.calculator, input), values);
			expect(rows.length, form.calculator).toBeGreaterThan(0);
		}
	});
});

describe('precision the method supports', () => {
	it('gives a glycol mix’s boiling point in whole degrees (the estimate is ±1.5 °C)', () => {
		// reference.md: 50 wt % EG at +15 psig boils at about 128.9 °C (±1.5 °C).
		const result = boilingPointUnderCap({
			capGauge: { value: 15, unit: 'psi' },
			glycol: { type: 'EG', percent: 50, basis: 'mass' }
		});
		expect(Number.isInteger(result.values.boilingPoint.value)).toBe(true);
		expect(Math.abs(result.values.boilingPoint.value - 128.9)).toBeLessThanOrEqual(1.5);
	});

	it('shows a conversion to the digits the person gave, not 12 of them', () => {
		// NIST SP 811, Appendix B: 1 psi = 6.894757 kPa, so 110 kPa = 15.954 psi.
		expect(formatSignificant(convertPressure(110, 'kPa', 'psi'), 3)).toBe('15.95');
		expect(formatSignificant(convertPressure(15, 'psi', 'kPa'), 2)).toBe('103.4');
		expect(formatSignificant(convertPressure(15.000001, 'psi', 'kPa'), 8)).toBe('103.42137');
	});
});
