// The physical range of every number a calculator takes, with where each bound comes from.
import type { CalculatorIssue } from './errors';
import { formatNumber } from './format';

/**
 * The physical range of every number a calculator takes, each with where its bounds come from.
 * A number outside its range is refused with a message at its field before any arithmetic, so no
 * calculator ever works on a figure no vehicle has (1e17 litres) or returns a non-finite answer.
 */
export interface InputRange {
	label: string;
	unit: string;
	min: number;
	max: number;
	/** The minimum itself is not allowed (a capacity must be more than 0). */
	minExclusive?: boolean;
	integer?: boolean;
	/** Where the bounds come from: a published source, or "common practice, no source". */
	source: string;
	/** What to say below the minimum or above the maximum, where the default would not help. */
	tooLow?: string;
	tooHigh?: string;
}

const SYSTEM_VOLUME =
	'common practice, no source: a car holds 5–15 L of coolant and a heavy truck 30–100 L; 1,000 L leaves room for large stationary engines';
const SHARE = 'a share of a whole: 0 to 100 %';
const FREEZE_TEMPERATURE =
	'absolute zero (−273.15 °C) to the boiling point of water at one atmosphere (100 °C): no coolant freezes outside this';

/** Data table: one row per input quantity. Calculators refer to these rows by name. */
export const inputRanges = {
	capacityL: {
		label: 'System capacity',
		unit: 'L',
		min: 0,
		minExclusive: true,
		max: 1_000,
		source: SYSTEM_VOLUME,
		tooHigh:
			'System capacity must be at most 1,000 L: no vehicle cooling system holds more. Check the unit.'
	},
	drainL: {
		label: 'Drain volume',
		unit: 'L',
		min: 0,
		max: 1_000,
		source: SYSTEM_VOLUME,
		tooLow: 'Drain volume cannot be negative.'
	},
	cycles: {
		label: 'Number of cycles',
		unit: '',
		min: 1,
		max: 100,
		integer: true,
		source:
			'common practice, no source: past a handful of drain-and-fills the job is a flush; 0 cycles renews nothing'
	},
	targetFreshPercent: {
		label: 'Target share of fresh coolant',
		unit: '%',
		min: 0,
		minExclusive: true,
		max: 100,
		source: `${SHARE}; a target of 0 % needs no cycle at all`
	},
	glycolPercent: {
		label: 'Glycol concentration',
		unit: '%',
		min: 0,
		max: 100,
		source: SHARE
	},
	refillPercent: {
		label: 'Refill strength',
		unit: '%',
		min: 0,
		minExclusive: true,
		max: 100,
		source: `${SHARE}; a refill with no glycol cannot strengthen a mix`
	},
	freezePointC: {
		label: 'Freeze point',
		unit: '°C',
		min: -273.15,
		max: 100,
		source: FREEZE_TEMPERATURE
	},
	capGaugeKPa: {
		label: 'Cap pressure',
		unit: 'kPa',
		min: 0,
		max: 300,
		source:
			'SAE J164 groups caps at 3–16 psi (about 21–110 kPa); 300 kPa leaves room for heavy-duty caps and catches a wrong unit'
	},
	altitudeM: {
		label: 'Altitude',
		unit: 'm',
		min: -500,
		max: 11_000,
		tooHigh: "Altitude must be between −500 and 11,000 m (the standard atmosphere's lowest layer).",
		tooLow: "Altitude must be between −500 and 11,000 m (the standard atmosphere's lowest layer).",
		source:
			'US Standard Atmosphere 1976, troposphere layer (up to 11 km); the lowest road, by the Dead Sea, lies about 430 m below sea level (from memory)'
	},
	odometerKm: {
		label: 'Odometer',
		unit: 'km',
		min: 0,
		max: 9_999_999,
		source: 'common practice, no source: what a seven-digit odometer can show'
	},
	averageKmPerDay: {
		label: 'Average distance',
		unit: 'km a day',
		min: 0,
		max: 2_000,
		source: 'common practice, no source: 24 hours a day at over 80 km/h'
	},
	firstChangeKm: {
		label: 'First change distance',
		unit: 'km',
		min: 1_000,
		max: 2_000_000,
		integer: true,
		source: 'common practice, no source: long-life coolant is first changed around 160,000 km'
	},
	thenEveryKm: {
		label: 'Change interval',
		unit: 'km',
		min: 1_000,
		max: 2_000_000,
		integer: true,
		source: 'common practice, no source: then about every 80,000 km'
	},
	everyMonths: {
		label: 'Time interval',
		unit: 'months',
		min: 1,
		max: 240,
		integer: true,
		source: 'common practice, no source: every 60 months; 20 years is beyond any coolant'
	},
	dueSoonDays: {
		label: 'Due-soon warning',
		unit: 'days',
		min: 0,
		max: 365,
		integer: true,
		source: 'common practice, no source: a warning more than a year ahead is no warning'
	},
	dueSoonKm: {
		label: 'Due-soon warning',
		unit: 'km',
		min: 0,
		max: 100_000,
		integer: true,
		source: 'common practice, no source: more than a whole interval ahead is no warning'
	}
} as const satisfies Record<string, InputRange>;

export type RangeName = keyof typeof inputRanges;

/**
 * Unit conversion takes any value of its quantity within these bounds, checked in the quantity's
 * SI unit so that 1e308 psi is refused before it overflows.
 */
export const conversionRanges = {
	volume: {
		label: 'A volume',
		unit: 'L',
		min: 0,
		max: 1_000_000,
		tooLow: 'A volume cannot be negative.',
		source: 'common practice, no source: a road tanker holds about 40,000 L'
	},
	pressure: {
		label: 'A pressure',
		unit: 'Pa',
		min: -101_325,
		max: 1_000_000_000,
		source:
			'a full vacuum read as gauge pressure (−101.325 kPa, one standard atmosphere) up to 1 GPa, beyond any workshop hydraulics (common practice, no source)'
	},
	torque: {
		label: 'A torque',
		unit: 'N·m',
		min: -1_000_000,
		max: 1_000_000,
		source: 'common practice, no source: heavy-truck wheel nuts take under 1,000 N·m'
	},
	temperature: {
		label: 'A temperature',
		unit: 'K',
		min: 0,
		max: 10_000,
		source: 'absolute zero (0 K) up to 10,000 K, hotter than any flame (common practice, no source)'
	}
} as const satisfies Record<string, InputRange>;

/** Calendar dates a calculator takes: motor vehicles, and date arithmetic safely in range. */
export const DATE_RANGE = {
	min: '1900-01-01',
	max: '2199-12-31',
	source: 'common practice, no source: the age of the motor car, with two centuries to spare'
} as const;

const withUnit = (value: number, unit: string) =>
	unit === '' ? formatNumber(value, 3) : `${formatNumber(value, 3)} ${unit}`;

export function describeTooLow(range: InputRange): string {
	if (range.integer) return describeNotWhole(range);
	if (range.tooLow) return range.tooLow;
	if (range.minExclusive)
		return `${range.label} must be more than ${withUnit(range.min, range.unit)}.`;
	return describeBetween(range);
}

export function describeTooHigh(range: InputRange): string {
	if (range.integer) return describeNotWhole(range);
	return range.tooHigh ?? describeBetween(range);
}

function describeBetween(range: InputRange): string {
	return `${range.label} must be between ${withUnit(range.min, '')} and ${withUnit(range.max, range.unit)}.`;
}

export function describeNotWhole(range: InputRange): string {
	return `${range.label} must be a whole number from ${withUnit(range.min, '')} to ${withUnit(range.max, range.unit)}.`;
}

/** Why a value lies outside its range, as an issue at its field, or an empty list when it fits. */
export function checkRange(value: number, range: InputRange, path: string): CalculatorIssue[] {
	if (typeof value !== 'number' || Number.isNaN(value)) {
		return [{ path, message: `${range.label} must be a number.` }];
	}
	const low = range.minExclusive ? !(value > range.min) : !(value >= range.min);
	if (low) return [{ path, message: describeTooLow(range) }];
	if (!(value <= range.max)) return [{ path, message: describeTooHigh(range) }];
	if (range.integer && !Number.isInteger(value))
		return [{ path, message: describeNotWhole(range) }];
	return [];
}
