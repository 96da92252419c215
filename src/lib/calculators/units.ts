// Unit conversions for volume, pressure, torque and temperature, from the units' definitions.
import { CalculatorError, throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber } from './format';
import { checkRange, conversionRanges } from './ranges';
import type { CalculatorResult, Quantity } from './result';

/**
 * Unit conversions from the definitions themselves (NIST SP 811, Appendix B): the pound,
 * standard gravity, the inch and the gallons are exact, so every factor below is exact up to
 * double precision. Deriving psi and lbf·ft from the definitions, instead of copying rounded
 * printed factors, keeps a there-and-back conversion free of drift.
 */
const POUND_KG = 0.45359237;
const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
const POUND_FORCE_N = POUND_KG * STANDARD_GRAVITY_M_PER_S2;
const INCH_M = 0.0254;
const FOOT_M = 0.3048;

export const volumeUnits = ['L', 'US qt', 'US gal', 'UK gal'] as const;
export const pressureUnits = ['Pa', 'kPa', 'bar', 'psi', 'atm'] as const;
export const torqueUnits = ['N·m', 'lbf·ft', 'lbf·in'] as const;
export const temperatureUnits = ['°C', '°F', 'K'] as const;

export type VolumeUnit = (typeof volumeUnits)[number];
export type PressureUnit = (typeof pressureUnits)[number];
export type TorqueUnit = (typeof torqueUnits)[number];
export type TemperatureUnit = (typeof temperatureUnits)[number];
export type Unit = VolumeUnit | PressureUnit | TorqueUnit | TemperatureUnit;
export type PhysicalQuantity = 'volume' | 'pressure' | 'torque' | 'temperature';

/** Size of one unit in the quantity's SI unit (litre for volume: the shop's working unit). */
export const litresPerUnit: Record<VolumeUnit, number> = {
	L: 1,
	'US qt': 3.785411784 / 4,
	'US gal': 3.785411784,
	'UK gal': 4.54609
};

export const pascalsPerUnit: Record<PressureUnit, number> = {
	Pa: 1,
	kPa: 1000,
	bar: 100_000,
	psi: POUND_FORCE_N / (INCH_M * INCH_M),
	atm: 101_325
};

export const newtonMetresPerUnit: Record<TorqueUnit, number> = {
	'N·m': 1,
	'lbf·ft': POUND_FORCE_N * FOOT_M,
	'lbf·in': POUND_FORCE_N * INCH_M
};

const unitNames: Record<Unit, string> = {
	L: 'litres',
	'US qt': 'US quarts',
	'US gal': 'US gallons',
	'UK gal': 'imperial gallons',
	Pa: 'pascals',
	kPa: 'kilopascals',
	bar: 'bar',
	psi: 'pounds per square inch',
	atm: 'standard atmospheres',
	'N·m': 'newton metres',
	'lbf·ft': 'pound-force feet',
	'lbf·in': 'pound-force inches',
	'°C': 'degrees Celsius',
	'°F': 'degrees Fahrenheit',
	K: 'kelvins'
};

const quantityOfUnit = new Map<Unit, PhysicalQuantity>([
	...volumeUnits.map((u) => [u, 'volume'] as const),
	...pressureUnits.map((u) => [u, 'pressure'] as const),
	...torqueUnits.map((u) => [u, 'torque'] as const),
	...temperatureUnits.map((u) => [u, 'temperature'] as const)
]);

/** Other ways people type the same units, matched without regard to case or spaces. */
const aliases: Record<string, Unit> = {
	l: 'L',
	litre: 'L',
	litres: 'L',
	liter: 'L',
	liters: 'L',
	usqt: 'US qt',
	qt: 'US qt',
	quart: 'US qt',
	usquart: 'US qt',
	usgal: 'US gal',
	usgallon: 'US gal',
	ukgal: 'UK gal',
	impgal: 'UK gal',
	imperialgallon: 'UK gal',
	pa: 'Pa',
	kpa: 'kPa',
	bar: 'bar',
	psi: 'psi',
	atm: 'atm',
	'n·m': 'N·m',
	nm: 'N·m',
	'n.m': 'N·m',
	'n*m': 'N·m',
	'lbf·ft': 'lbf·ft',
	'lbf.ft': 'lbf·ft',
	lbfft: 'lbf·ft',
	'lb-ft': 'lbf·ft',
	'lb·ft': 'lbf·ft',
	'ft-lb': 'lbf·ft',
	'ft·lbf': 'lbf·ft',
	'lbf·in': 'lbf·in',
	'lbf.in': 'lbf·in',
	lbfin: 'lbf·in',
	'lb-in': 'lbf·in',
	'lb·in': 'lbf·in',
	'in-lb': 'lbf·in',
	'in·lbf': 'lbf·in',
	'°c': '°C',
	c: '°C',
	degc: '°C',
	celsius: '°C',
	'°f': '°F',
	f: '°F',
	degf: '°F',
	fahrenheit: '°F',
	k: 'K',
	kelvin: 'K'
};

const AMBIGUOUS_GALLON = new Set(['gal', 'gallon', 'gallons']);

export const allUnits: readonly Unit[] = [
	...volumeUnits,
	...pressureUnits,
	...torqueUnits,
	...temperatureUnits
];

export function isUnit(text: string): text is Unit {
	return quantityOfUnit.has(text as Unit);
}

export function describeUnit(unit: Unit): { unit: Unit; name: string; quantity: PhysicalQuantity } {
	return { unit, name: unitNames[unit], quantity: quantityOfUnit.get(unit) as PhysicalQuantity };
}

/** Reads a unit as a person or a script might type it ("psi", "lb-ft", "degC"). */
export function parseUnit(text: string, path = 'unit'): Unit {
	const trimmed = text.trim();
	if (isUnit(trimmed)) return trimmed;
	const key = trimmed.toLowerCase().replace(/\s+/g, '');
	if (AMBIGUOUS_GALLON.has(key)) {
		throw new CalculatorError(
			`"${trimmed}" is ambiguous: a US gallon is 3.785 L and an imperial gallon 4.546 L. Use "US gal" or "UK gal".`,
			path
		);
	}
	// Own keys only: "__proto__" or "constructor" must read as unknown units, not as Object's.
	const unit = Object.hasOwn(aliases, key) ? aliases[key] : undefined;
	if (!unit) {
		const shown = trimmed.length > 40 ? `${trimmed.slice(0, 40)}…` : trimmed;
		throw new CalculatorError(`Unknown unit "${shown}". Use one of: ${allUnits.join(', ')}.`, path);
	}
	return unit;
}

export function quantityOf(unit: Unit): PhysicalQuantity {
	return quantityOfUnit.get(unit) as PhysicalQuantity;
}

function checkFinite(value: number): void {
	if (!Number.isFinite(value)) {
		throw new CalculatorError('The value to convert must be a finite number.', 'value');
	}
}

/** Refuses a value outside its quantity's range, measured in the SI unit (see ranges.ts). */
function checkInRange(valueInSi: number, quantity: PhysicalQuantity): void {
	throwIfIssues(checkRange(valueInSi, conversionRanges[quantity], 'value'));
}

export function convertVolume(value: number, from: VolumeUnit, to: VolumeUnit): number {
	checkFinite(value);
	checkInRange(value * litresPerUnit[from], 'volume');
	return (value * litresPerUnit[from]) / litresPerUnit[to];
}

/** Works for absolute and gauge pressures alike: both scale the same way. */
export function convertPressure(value: number, from: PressureUnit, to: PressureUnit): number {
	checkFinite(value);
	checkInRange(value * pascalsPerUnit[from], 'pressure');
	return (value * pascalsPerUnit[from]) / pascalsPerUnit[to];
}

export function convertTorque(value: number, from: TorqueUnit, to: TorqueUnit): number {
	checkFinite(value);
	checkInRange(value * newtonMetresPerUnit[from], 'torque');
	return (value * newtonMetresPerUnit[from]) / newtonMetresPerUnit[to];
}

/** Converts a temperature reading (not a temperature difference). */
export function convertTemperature(
	value: number,
	from: TemperatureUnit,
	to: TemperatureUnit
): number {
	checkFinite(value);
	const kelvin =
		from === 'K' ? value : from === '°C' ? value + 273.15 : ((value - 32) * 5) / 9 + 273.15;
	if (kelvin < 0) {
		throw new CalculatorError(
			`${formatNumber(value)} ${from} is below absolute zero (0 K, −273.15 °C, −459.67 °F).`,
			'value'
		);
	}
	checkInRange(kelvin, 'temperature');
	if (from === to) return value;
	if (to === 'K') return kelvin;
	if (from === '°C' && to === '°F') return (value * 9) / 5 + 32;
	if (from === '°F' && to === '°C') return ((value - 32) * 5) / 9;
	const celsius = kelvin - 273.15;
	return to === '°C' ? celsius : (celsius * 9) / 5 + 32;
}

/**
 * Converts between two units of the same quantity. Units may be given as typed or as a person
 * writes them; a unit of another quantity (litres to psi) is an error, never a number.
 */
export function convert(value: number, from: VolumeUnit, to: VolumeUnit): number;
export function convert(value: number, from: PressureUnit, to: PressureUnit): number;
export function convert(value: number, from: TorqueUnit, to: TorqueUnit): number;
export function convert(value: number, from: TemperatureUnit, to: TemperatureUnit): number;
export function convert(value: number, from: string, to: string): number;
export function convert(value: number, from: string, to: string): number {
	const fromUnit = parseUnit(from, 'from');
	const toUnit = parseUnit(to, 'to');
	const fromQuantity = quantityOf(fromUnit);
	const toQuantity = quantityOf(toUnit);
	if (fromQuantity !== toQuantity) {
		throw new CalculatorError(
			`Cannot convert ${unitNames[fromUnit]} (${fromQuantity}) to ${unitNames[toUnit]} (${toQuantity}).`,
			'to'
		);
	}
	switch (fromQuantity) {
		case 'volume':
			return convertVolume(value, fromUnit as VolumeUnit, toUnit as VolumeUnit);
		case 'pressure':
			return convertPressure(value, fromUnit as PressureUnit, toUnit as PressureUnit);
		case 'torque':
			return convertTorque(value, fromUnit as TorqueUnit, toUnit as TorqueUnit);
		case 'temperature':
			return convertTemperature(value, fromUnit as TemperatureUnit, toUnit as TemperatureUnit);
	}
}

export interface ConversionInput {
	value: number;
	from: string;
	to: string;
}

export type ConversionValues = {
	input: Quantity<Unit>;
	output: Quantity<Unit>;
	quantity: PhysicalQuantity;
};

/** The unit-conversion calculator: one value from one unit to another, with the factor used. */
export function calculateConversion(input: ConversionInput): CalculatorResult<ConversionValues> {
	throwIfIssues(checkConversionInput(input));
	const from = parseUnit(input.from, 'from');
	const to = parseUnit(input.to, 'to');
	const output = convert(input.value, from, to);
	const quantity = quantityOf(from);
	const step =
		quantity === 'temperature'
			? describeTemperatureFormula(from as TemperatureUnit, to as TemperatureUnit)
			: `1 ${from} = ${Number(convert(1, from, to).toPrecision(12))} ${to}`;
	return {
		values: {
			input: { value: input.value, unit: from },
			// Twelve significant digits hide float noise (0.1 + 0.2) and keep every digit of the exact factors that matters.
			output: { value: Number(output.toPrecision(12)), unit: to },
			quantity
		},
		basis:
			'Exact definitions (NIST SP 811, Appendix B): 1 lb = 0.45359237 kg, standard gravity 9.80665 m/s², 1 in = 0.0254 m, 1 US gal = 3.785411784 L, 1 UK gal = 4.54609 L, 1 atm = 101,325 Pa, 1 bar = 100,000 Pa, 0 °C = 273.15 K.',
		accuracy: 'Exact by definition; shown to 12 significant digits.',
		warnings:
			quantity === 'pressure'
				? [
						'Gauge and absolute pressures convert the same way; keep track of which one you have (absolute = gauge + atmospheric).'
					]
				: [],
		cautions: [],
		steps: [step]
	};
}

function describeTemperatureFormula(from: TemperatureUnit, to: TemperatureUnit): string {
	const formulas: Record<string, string> = {
		'°C>°F': '°F = °C × 9/5 + 32',
		'°F>°C': '°C = (°F − 32) × 5/9',
		'°C>K': 'K = °C + 273.15',
		'K>°C': '°C = K − 273.15',
		'°F>K': 'K = (°F − 32) × 5/9 + 273.15',
		'K>°F': '°F = (K − 273.15) × 9/5 + 32'
	};
	return formulas[`${from}>${to}`] ?? `Same unit: ${from}`;
}

export function checkConversionInput(input: ConversionInput): CalculatorIssue[] {
	const issues: CalculatorIssue[] = [];
	const units: Partial<Record<'from' | 'to', Unit>> = {};
	for (const path of ['from', 'to'] as const) {
		try {
			units[path] = parseUnit(input[path], path);
		} catch (error) {
			if (!(error instanceof CalculatorError)) throw error;
			issues.push({ path, message: error.message });
		}
	}
	if (issues.length > 0 || !units.from || !units.to) return issues;
	try {
		convert(input.value, units.from, units.to);
	} catch (error) {
		if (!(error instanceof CalculatorError)) throw error;
		issues.push(...error.issues);
	}
	return issues;
}
