// How result rows read: each figure with its unit, in the unit the person chose.
import {
	convertTemperature,
	convertVolume,
	formatNumber,
	type Quantity,
	type VolumeUnit
} from '../calculators';

/** Result rows as a person reads them: each number with its unit, in the unit they chose. */
export type DisplayRow = {
	key: string;
	label: string;
	text: string;
	/** The same value in the other common unit. */
	also?: string;
	/** Marks a status that needs attention. */
	tone?: 'ok' | 'caution' | 'alarm';
};

export const temperatureChoices = ['°C', '°F'] as const;
export const volumeChoices = ['L', 'US qt', 'US gal', 'UK gal'] as const;
export const pressureChoices = ['kPa', 'psi', 'bar'] as const;
export const altitudeChoices = ['m', 'ft'] as const;
export type TemperatureChoice = (typeof temperatureChoices)[number];

/** The value's own decimals (the calculator rounded it to what its method supports). */
const decimalsOf = (value: number) => Math.min(2, (String(value).split('.')[1] ?? '').length);

export const show = (quantity: Quantity, decimals = decimalsOf(quantity.value)) =>
	`${formatNumber(quantity.value, decimals)} ${quantity.unit}`;

/** A temperature in the chosen unit first; °F to one decimal, or whole degrees where °C is. */
export function showTemperature(
	quantity: Quantity,
	unit: TemperatureChoice
): Pick<DisplayRow, 'text' | 'also'> {
	const decimals = decimalsOf(quantity.value);
	const celsius = `${formatNumber(quantity.value, decimals)} °C`;
	const fahrenheit = `${formatNumber(convertTemperature(quantity.value, '°C', '°F'), decimals === 0 ? 0 : 1)} °F`;
	return unit === '°F' ? { text: fahrenheit, also: celsius } : { text: celsius, also: fahrenheit };
}

export function showVolume(litres: Quantity, unit: VolumeUnit): Pick<DisplayRow, 'text' | 'also'> {
	const inLitres = `${formatNumber(litres.value, 2)} L`;
	if (unit === 'L') return { text: inLitres };
	return {
		text: `${formatNumber(convertVolume(litres.value, 'L', unit), 2)} ${unit}`,
		also: inLitres
	};
}

/** The chosen unit, or the first choice when the value is not one of them. */
export const choiceOf = <T extends string>(value: string | undefined, choices: readonly T[]): T =>
	(choices as readonly string[]).includes(value ?? '') ? (value as T) : choices[0];
