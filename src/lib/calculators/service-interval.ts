import { CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE } from './cautions';
import { throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber } from './format';
import { toQuantity, type CalculatorResult, type Quantity } from './result';

/**
 * When the next coolant change is due: by distance or by time, whichever comes first. The
 * default figures are common practice for long-life coolant, no published source: first
 * change around 160,000 km (100,000 miles), then about every 80,000 km (50,000 miles), and
 * every 60 months. The shop sets its own; the vehicle maker's schedule comes first.
 */
export interface IntervalSettings {
	firstChangeKm: number;
	thenEveryKm: number;
	everyMonths: number;
	dueSoonDays: number;
	dueSoonKm: number;
}

export const DEFAULT_INTERVAL_SETTINGS: Readonly<IntervalSettings> = {
	firstChangeKm: 160_000,
	thenEveryKm: 80_000,
	everyMonths: 60,
	dueSoonDays: 30,
	dueSoonKm: 2_000
};

export type LastChange =
	{ kind: 'changed'; date: string; odometerKm: number } | { kind: 'never'; inServiceDate: string };

export interface ServiceIntervalInput {
	lastChange: LastChange;
	/** Today, as YYYY-MM-DD. */
	currentDate: string;
	currentOdometerKm: number;
	/** Used to project the date the distance limit falls on; estimated from history when left out. */
	averageKmPerDay?: number;
	settings?: Partial<IntervalSettings>;
}

export type ServiceStatus = 'ok' | 'due_soon' | 'overdue';
export type FirstLimit = 'distance' | 'time' | 'unknown';

export type ServiceIntervalValues = {
	status: ServiceStatus;
	firstLimit: FirstLimit;
	/** The earlier of the time limit and the projected date of the distance limit. */
	dueDate: string;
	timeDueDate: string;
	distanceDueDate: string | null;
	dueOdometer: Quantity<'km'>;
	daysRemaining: Quantity<'days'>;
	kmRemaining: Quantity<'km'>;
	averageDistance: Quantity<'km/day'> | null;
};

/** Beyond this the figure is a typing slip, not a vehicle (24 h a day at over 80 km/h). */
export const MAX_KM_PER_DAY = 2_000;
/** A history shorter than this says little about how far the vehicle goes in a day. */
const MIN_DAYS_FOR_ESTIMATE = 30;
const MS_PER_DAY = 86_400_000;

/** Reads YYYY-MM-DD as a UTC day number, or null when it is not a real calendar date. */
export function parseIsoDate(text: string): number | null {
	const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
	if (!match) return null;
	const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
	const time = Date.UTC(year, month - 1, day);
	const date = new Date(time);
	if (
		date.getUTCFullYear() !== year ||
		date.getUTCMonth() !== month - 1 ||
		date.getUTCDate() !== day
	) {
		return null;
	}
	return time / MS_PER_DAY;
}

export function formatIsoDate(dayNumber: number): string {
	return new Date(dayNumber * MS_PER_DAY).toISOString().slice(0, 10);
}

/** Adds calendar months; a day that the target month lacks falls back to its last day (31 Jan + 1 month = 28 or 29 Feb). */
export function addMonths(dayNumber: number, months: number): number {
	const date = new Date(dayNumber * MS_PER_DAY);
	const year = date.getUTCFullYear();
	const month = date.getUTCMonth() + months;
	const lastDay = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
	return Date.UTC(year, month, Math.min(date.getUTCDate(), lastDay)) / MS_PER_DAY;
}

function resolveSettings(partial: Partial<IntervalSettings> | undefined): IntervalSettings {
	return { ...DEFAULT_INTERVAL_SETTINGS, ...partial };
}

function checkWholeNumber(
	value: number,
	path: string,
	label: string,
	min: number,
	max: number,
	unit: string
): CalculatorIssue[] {
	if (!Number.isInteger(value) || value < min || value > max) {
		return [
			{
				path,
				message: `${label} must be a whole number from ${formatNumber(min)} to ${formatNumber(max)} ${unit}.`
			}
		];
	}
	return [];
}

export function checkServiceIntervalInput(input: ServiceIntervalInput): CalculatorIssue[] {
	const issues: CalculatorIssue[] = [];
	const settings = resolveSettings(input.settings);
	issues.push(
		...checkWholeNumber(
			settings.firstChangeKm,
			'settings.firstChangeKm',
			'First change distance',
			1_000,
			2_000_000,
			'km'
		),
		...checkWholeNumber(
			settings.thenEveryKm,
			'settings.thenEveryKm',
			'Change interval',
			1_000,
			2_000_000,
			'km'
		),
		...checkWholeNumber(
			settings.everyMonths,
			'settings.everyMonths',
			'Time interval',
			1,
			240,
			'months'
		),
		...checkWholeNumber(
			settings.dueSoonDays,
			'settings.dueSoonDays',
			'Due-soon warning',
			0,
			365,
			'days'
		),
		...checkWholeNumber(
			settings.dueSoonKm,
			'settings.dueSoonKm',
			'Due-soon warning',
			0,
			100_000,
			'km'
		)
	);
	const today = parseIsoDate(input.currentDate);
	if (today === null) {
		issues.push({
			path: 'currentDate',
			message: "Today's date must be a real date written as YYYY-MM-DD."
		});
	}
	if (!Number.isFinite(input.currentOdometerKm) || input.currentOdometerKm < 0) {
		issues.push({
			path: 'currentOdometerKm',
			message: 'The current odometer reading cannot be negative.'
		});
	}
	const last = input.lastChange;
	const startPath = last.kind === 'changed' ? 'lastChange.date' : 'lastChange.inServiceDate';
	const start = parseIsoDate(last.kind === 'changed' ? last.date : last.inServiceDate);
	if (start === null) {
		issues.push({
			path: startPath,
			message:
				last.kind === 'changed'
					? 'The date of the last coolant change must be a real date written as YYYY-MM-DD.'
					: 'The in-service date must be a real date written as YYYY-MM-DD.'
		});
	} else if (today !== null && start > today) {
		issues.push({
			path: startPath,
			message:
				last.kind === 'changed'
					? `The last coolant change (${last.date}) cannot be after today (${input.currentDate}).`
					: `The in-service date (${last.inServiceDate}) cannot be after today (${input.currentDate}).`
		});
	}
	if (last.kind === 'changed') {
		if (!Number.isFinite(last.odometerKm) || last.odometerKm < 0) {
			issues.push({
				path: 'lastChange.odometerKm',
				message: 'The odometer at the last change cannot be negative.'
			});
		} else if (
			Number.isFinite(input.currentOdometerKm) &&
			input.currentOdometerKm < last.odometerKm
		) {
			issues.push({
				path: 'currentOdometerKm',
				message: `The current odometer (${formatNumber(input.currentOdometerKm, 0)} km) is lower than at the last coolant change (${formatNumber(last.odometerKm, 0)} km).`
			});
		}
	}
	if (input.averageKmPerDay !== undefined) {
		const average = input.averageKmPerDay;
		if (!Number.isFinite(average) || average < 0 || average > MAX_KM_PER_DAY) {
			issues.push({
				path: 'averageKmPerDay',
				message: `Average distance must be between 0 and ${formatNumber(MAX_KM_PER_DAY)} km a day.`
			});
		}
	}
	return issues;
}

export function calculateServiceInterval(
	input: ServiceIntervalInput
): CalculatorResult<ServiceIntervalValues> {
	throwIfIssues(checkServiceIntervalInput(input));
	const settings = resolveSettings(input.settings);
	const last = input.lastChange;
	const today = parseIsoDate(input.currentDate) as number;
	const startDay = parseIsoDate(last.kind === 'changed' ? last.date : last.inServiceDate) as number;
	// A vehicle never changed is counted from new: its first limit is an odometer reading.
	const startOdometerKm = last.kind === 'changed' ? last.odometerKm : 0;
	const dueOdometerKm =
		last.kind === 'changed' ? last.odometerKm + settings.thenEveryKm : settings.firstChangeKm;
	const timeDueDay = addMonths(startDay, settings.everyMonths);
	const kmRemaining = dueOdometerKm - input.currentOdometerKm;
	const steps: string[] = [
		last.kind === 'changed'
			? `Last change on ${last.date} at ${formatNumber(last.odometerKm, 0)} km: the next is due at ${formatNumber(dueOdometerKm, 0)} km (+${formatNumber(settings.thenEveryKm, 0)} km) or on ${formatIsoDate(timeDueDay)} (+${settings.everyMonths} months), whichever comes first.`
			: `Never changed since ${last.inServiceDate}: the first change is due at ${formatNumber(dueOdometerKm, 0)} km or on ${formatIsoDate(timeDueDay)} (+${settings.everyMonths} months), whichever comes first.`
	];
	const warnings: string[] = [];

	let averageKmPerDay: number | null = input.averageKmPerDay ?? null;
	const elapsedDays = today - startDay;
	if (averageKmPerDay === null && elapsedDays >= MIN_DAYS_FOR_ESTIMATE) {
		averageKmPerDay = (input.currentOdometerKm - startOdometerKm) / elapsedDays;
		steps.push(
			`Average use estimated from ${formatNumber(input.currentOdometerKm - startOdometerKm, 0)} km in ${formatNumber(elapsedDays, 0)} days${last.kind === 'never' ? ' (counted from 0 km at the in-service date)' : ''}: ${formatNumber(averageKmPerDay, 1)} km a day.`
		);
	}

	let distanceDueDay: number | null = null;
	if (averageKmPerDay !== null && averageKmPerDay > 0) {
		// Rounded up to whole days so the projected day is never before the limit is reached.
		distanceDueDay = today + Math.ceil(kmRemaining / averageKmPerDay);
		steps.push(
			`At ${formatNumber(averageKmPerDay, 1)} km a day the odometer reaches ${formatNumber(dueOdometerKm, 0)} km on about ${formatIsoDate(distanceDueDay)}.`
		);
	} else {
		warnings.push(
			averageKmPerDay === 0
				? 'The vehicle is not being driven, so only the time limit can fall due.'
				: 'Without an average distance per day the date of the distance limit cannot be projected; give one to see which limit comes first.'
		);
	}

	let firstLimit: FirstLimit;
	if (distanceDueDay !== null) {
		firstLimit = distanceDueDay < timeDueDay ? 'distance' : 'time';
	} else if (averageKmPerDay === 0) {
		firstLimit = 'time';
	} else if (kmRemaining < 0 && today <= timeDueDay) {
		firstLimit = 'distance';
	} else if (today > timeDueDay && kmRemaining >= 0) {
		firstLimit = 'time';
	} else {
		firstLimit = 'unknown';
	}

	const dueDay = distanceDueDay === null ? timeDueDay : Math.min(timeDueDay, distanceDueDay);
	const daysRemaining = dueDay - today;
	let status: ServiceStatus;
	if (today > timeDueDay || kmRemaining < 0) {
		status = 'overdue';
	} else if (daysRemaining <= settings.dueSoonDays || kmRemaining <= settings.dueSoonKm) {
		status = 'due_soon';
	} else {
		status = 'ok';
	}
	steps.push(
		status === 'overdue'
			? `Overdue: ${kmRemaining < 0 ? `${formatNumber(-kmRemaining, 0)} km past the distance limit` : `${formatNumber(today - timeDueDay, 0)} days past the time limit`}.`
			: `${formatNumber(daysRemaining, 0)} days and ${formatNumber(kmRemaining, 0)} km remain (due soon within ${settings.dueSoonDays} days or ${formatNumber(settings.dueSoonKm, 0)} km).`
	);

	return {
		values: {
			status,
			firstLimit,
			dueDate: formatIsoDate(dueDay),
			timeDueDate: formatIsoDate(timeDueDay),
			distanceDueDate: distanceDueDay === null ? null : formatIsoDate(distanceDueDay),
			dueOdometer: toQuantity(dueOdometerKm, 'km', 0),
			daysRemaining: toQuantity(daysRemaining, 'days', 0),
			kmRemaining: toQuantity(kmRemaining, 'km', 0),
			averageDistance: averageKmPerDay === null ? null : toQuantity(averageKmPerDay, 'km/day', 1)
		},
		basis: `Shop interval: first change at ${formatNumber(settings.firstChangeKm, 0)} km, then every ${formatNumber(settings.thenEveryKm, 0)} km, or every ${settings.everyMonths} months, whichever comes first. The default figures (160,000 km, 80,000 km, 60 months) are common practice for long-life coolant, no published source; the vehicle maker's schedule and the coolant's label come first.`,
		accuracy:
			distanceDueDay === null
				? undefined
				: 'The date of the distance limit is a projection from the average use; the odometer reading decides.',
		warnings,
		cautions: [CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
		steps
	};
}
