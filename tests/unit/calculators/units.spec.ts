import { describe, expect, it } from 'vitest';
import {
	calculateConversion,
	convert,
	convertPressure,
	convertTemperature,
	convertTorque,
	convertVolume,
	litresPerUnit,
	newtonMetresPerUnit,
	parseUnit,
	pascalsPerUnit,
	pressureUnits,
	temperatureUnits,
	torqueUnits,
	volumeUnits
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

describe('conversion factors (NIST SP 811, Appendix B, exact by definition)', () => {
	// Each factor is compared to the digits printed in NIST SP 811 Appendix B (as quoted in
	// reference.md); toBeCloseTo(x, d) holds to half a unit in the last printed decimal.
	it('gives 1 psi = 6894.757293168 Pa', () => {
		expect(pascalsPerUnit.psi).toBeCloseTo(6894.757293168, 9);
	});

	it('gives 1 lbf = 4.4482216152605 N (psi × in²)', () => {
		expect(pascalsPerUnit.psi * 0.0254 ** 2).toBeCloseTo(4.4482216152605, 13);
	});

	it('gives 1 lbf·ft = 1.3558179483314 N·m and 1 lbf·in = 0.1129848290276 N·m', () => {
		expect(newtonMetresPerUnit['lbf·ft']).toBeCloseTo(1.3558179483314, 13);
		expect(newtonMetresPerUnit['lbf·in']).toBeCloseTo(0.1129848290276, 13);
	});

	it('gives 1 US gal = 3.785411784 L, 1 US qt = 0.946352946 L, 1 UK gal = 4.54609 L', () => {
		expect(litresPerUnit['US gal']).toBe(3.785411784);
		expect(litresPerUnit['US qt']).toBeCloseTo(0.946352946, 12);
		expect(litresPerUnit['UK gal']).toBe(4.54609);
	});

	it('gives 1 atm = 101325 Pa and 1 bar = 100000 Pa', () => {
		expect(convertPressure(1, 'atm', 'Pa')).toBe(101_325);
		expect(convertPressure(1, 'bar', 'Pa')).toBe(100_000);
	});

	it('converts the fixed points of the temperature scales by definition', () => {
		expect(convertTemperature(100, '°C', '°F')).toBeCloseTo(212, 12);
		expect(convertTemperature(-40, '°C', '°F')).toBeCloseTo(-40, 12);
		expect(convertTemperature(0, '°C', 'K')).toBe(273.15);
		expect(convertTemperature(-459.67, '°F', 'K')).toBeCloseTo(0, 10);
		expect(convertTemperature(212, '°F', '°C')).toBeCloseTo(100, 12);
	});

	it('converts a 15 psi cap to 103.42 kPa, as printed in the reference cap table', () => {
		expect(convert(15, 'psi', 'kPa')).toBeCloseTo(103.42, 2);
		expect(convert(13, 'psi', 'kPa')).toBeCloseTo(89.63, 2);
		expect(convert(18, 'psi', 'kPa')).toBeCloseTo(124.11, 2);
	});
});

describe('round trips', () => {
	const samples = [0, 0.001, 1, 7.5, 13, 101.325, 4_500.25];
	const groups = [
		['volume', volumeUnits],
		['pressure', pressureUnits],
		['torque', torqueUnits],
		['temperature', temperatureUnits]
	] as const;

	for (const [quantity, units] of groups) {
		it(`returns every ${quantity} value to itself after converting there and back`, () => {
			for (const from of units) {
				for (const to of units) {
					for (const value of samples) {
						const there = convert(value, from, to);
						const back = convert(there, to, from);
						expect(Math.abs(back - value)).toBeLessThanOrEqual(
							1e-12 * Math.max(1, Math.abs(value))
						);
					}
				}
			}
		});
	}

	it('agrees between the typed helpers and the generic convert', () => {
		expect(convertVolume(5, 'UK gal', 'L')).toBe(convert(5, 'UK gal', 'L'));
		expect(convertTorque(100, 'N·m', 'lbf·ft')).toBe(convert(100, 'N·m', 'lbf·ft'));
		expect(convertTorque(100, 'N·m', 'lbf·ft')).toBeCloseTo(73.7562, 4);
	});
});

describe('unit names as people type them', () => {
	it('accepts common spellings', () => {
		expect(parseUnit('lb-ft')).toBe('lbf·ft');
		expect(parseUnit('ft-lb')).toBe('lbf·ft');
		expect(parseUnit('Nm')).toBe('N·m');
		expect(parseUnit('degC')).toBe('°C');
		expect(parseUnit(' kpa ')).toBe('kPa');
		expect(parseUnit('us gal')).toBe('US gal');
		expect(parseUnit('imp gal')).toBe('UK gal');
		expect(convert(1, 'F', 'C')).toBeCloseTo(-17.2222, 4);
	});

	it('refuses a bare gallon because US and imperial gallons differ by 20 %', () => {
		expectCalculatorError(() => convert(1, 'gal', 'L'), /ambiguous.*"US gal" or "UK gal"/, 'from');
	});
});

describe('conversion errors', () => {
	it('rejects an unknown unit with the list of known ones', () => {
		expectCalculatorError(
			() => convert(1, 'furlong', 'L'),
			'Unknown unit "furlong". Use one of: L, US qt, US gal, UK gal, Pa, kPa, bar, psi, atm, N·m, lbf·ft, lbf·in, °C, °F, K.',
			'from'
		);
	});

	it('rejects a conversion between two quantities', () => {
		expectCalculatorError(
			() => convert(10, 'L', 'psi'),
			'Cannot convert litres (volume) to pounds per square inch (pressure).',
			'to'
		);
		expectCalculatorError(() => convert(10, '°C', 'N·m'), /temperature.*torque/);
	});

	it('rejects temperatures below absolute zero', () => {
		expectCalculatorError(() => convert(-300, '°C', 'K'), /below absolute zero/);
		expectCalculatorError(() => convert(-1, 'K', '°C'), /below absolute zero/);
	});

	it('rejects a negative volume and a value that is not a finite number', () => {
		expectCalculatorError(() => convert(-2, 'L', 'US qt'), 'A volume cannot be negative.');
		expectCalculatorError(() => convert(Number.NaN, 'psi', 'kPa'), /finite number/);
		expectCalculatorError(() => convert(Infinity, 'psi', 'kPa'), /finite number/);
	});
});

describe('calculateConversion', () => {
	it('returns both values with their units and the factor used', () => {
		const result = calculateConversion({ value: 15, from: 'psi', to: 'kPa' });
		expect(result.values.input).toEqual({ value: 15, unit: 'psi' });
		expect(result.values.output.unit).toBe('kPa');
		expect(result.values.output.value).toBeCloseTo(103.421359, 6);
		expect(result.steps?.[0]).toBe('1 psi = 6.89475729317 kPa');
		expect(result.basis).toMatch(/NIST SP 811/);
	});

	it('shows the formula for temperatures and hides float noise', () => {
		const result = calculateConversion({ value: 37.8, from: '°C', to: '°F' });
		expect(result.values.output).toEqual({ value: 100.04, unit: '°F' });
		expect(result.steps?.[0]).toBe('°F = °C × 9/5 + 32');
	});
});
