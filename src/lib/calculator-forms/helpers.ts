// Pieces the calculator forms share: common choices and reading numbers in a chosen unit.
import {
	CalculatorError,
	convertTemperature,
	litresPerUnit,
	type VolumeUnit
} from '../calculators';
import { choiceOf, type TemperatureChoice } from './display';
import { readFormNumber, type FieldErrors, type FormValues, type Option } from './fields';

/** Shared pieces of the calculator forms: common choices and reading numbers in a chosen unit. */
export const glycolOptions: Option[] = [
	{ value: 'EG', label: 'Ethylene glycol (EG)' },
	{ value: 'PG', label: 'Propylene glycol (PG)' }
];
export const basisOptions: Option[] = [
	{ value: 'volume', label: 'By volume (vol %), as antifreeze is mixed' },
	{ value: 'mass', label: 'By mass (wt %)' }
];

/** Reads a number and converts it to the calculator's unit; a refused conversion is a field error. */
export function readConverted(
	values: FormValues,
	field: string,
	errors: FieldErrors,
	convert: (value: number) => number
): number | undefined {
	const value = readFormNumber(values[field]);
	if (value === undefined || !Number.isFinite(value)) return value;
	try {
		return convert(value);
	} catch (error) {
		if (!(error instanceof CalculatorError)) throw error;
		errors[field] = error.message;
		return Number.NaN;
	}
}

export const toCelsius = (unit: TemperatureChoice) => (value: number) =>
	convertTemperature(value, unit, '°C');
/** Plain scaling, so that the calculator's own range (not the converter's) judges the volume. */
export const toLitres = (unit: VolumeUnit) => (value: number) => value * litresPerUnit[unit];

export const temperatureUnitOf = (values: FormValues) =>
	choiceOf(values.temperatureUnit, ['°C', '°F'] as const);
