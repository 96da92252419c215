// Coolant service interval: when the next change is due, by distance or by time.
import { CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE } from './cautions';
import { throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber } from './format';
import { checkRange, DATE_RANGE, inputRanges } from './ranges';
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
export const MAX_KM_PER_DAY = inputRanges.averageKmPerDay.max;
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

const settingNames = [
	'firstChangeKm',
	'thenEveryKm',
	'everyMonths',
	'dueSoonDays',
	'dueSoonKm'
] as const satisfies readonly (keyof IntervalSettings)[];

/** The date the interval runs from (last change or in service): valid and not after today. */
function checkStartDate(
	input: ServiceIntervalInput,
	today: number | null
): { start: number | null; issues: CalculatorIssue[] } {
	const last = input.lastChange;
	const startPath = last.kind === 'changed' ? 'lastChange.date' : 'lastChange.inServiceDate';
	const startText = last.kind === 'changed' ? last.date : last.inServiceDate;
	const issues = checkDate(
		startText,
		startPath,
		last.kind === 'changed' ? 'The date of the last coolant change' : 'The in-service date'
	);
	const start = issues.length === 0 ? parseIsoDate(startText) : null;
	if (start !== null && today !== null && start > today) {
		issues.push({
			path: startPath,
			message:
				last.kind === 'changed'
					? `The last coolant change (${last.date}) cannot be after today (${input.currentDate}).`
					: `The in-service date (${last.inServiceDate}) cannot be after today (${input.currentDate}).`
		});
	}
	return { start, issues };
}

/** The odometer at the last change (when there was one): in range and not above today's. */
function checkLastChangeOdometer(input: ServiceIntervalInput): CalculatorIssue[] {
	const last = input.lastChange;
	if (last.kind !== 'changed') return [];
	const issues = checkRange(
		last.odometerKm,
		odometerRange('The odometer at the last change'),
		'lastChange.odometerKm'
	);
	if (
		issues.length === 0 &&
		Number.isFinite(input.currentOdometerKm) &&
		input.currentOdometerKm < last.odometerKm
	) {
		return [
			{
				path: 'currentOdometerKm',
				message: `The current odometer (${formatNumber(input.currentOdometerKm, 0)} km) is lower than at the last coolant change (${formatNumber(last.odometerKm, 0)} km).`
			}
		];
	}
	return issues;
}

/** Reads a date the calculator can count with: a real calendar day within DATE_RANGE. */
function checkDate(text: string, path: string, what: string): CalculatorIssue[] {
	if (parseIsoDate(text) === null) {
		return [{ path, message: `${what} must be a real date written as YYYY-MM-DD.` }];
	}
	if (text < DATE_RANGE.min || text > DATE_RANGE.max) {
		return [{ path, message: `${what} must be between ${DATE_RANGE.min} and ${DATE_RANGE.max}.` }];
	}
	return [];
}

export function checkServiceIntervalInput(input: ServiceIntervalInput): CalculatorIssue[] {
	const issues: CalculatorIssue[] = [];
	const settings = resolveSettings(input.settings);
	for (const name of settingNames) {
		issues.push(...checkRange(settings[name], inputRanges[name], `settings.${name}`));
	}
	const todayIssues = checkDate(input.currentDate, 'currentDate', "Today's date");
	issues.push(...todayIssues);
	const today = todayIssues.length === 0 ? parseIsoDate(input.currentDate) : null;
	issues.push(
		...checkRange(
			input.currentOdometerKm,
			odometerRange('The current odometer reading'),
			'currentOdometerKm'
		)
	);
	const { start, issues: startIssues } = checkStartDate(input, today);
	issues.push(...startIssues);
	issues.push(...checkLastChangeOdometer(input));
	if (input.averageKmPerDay !== undefined) {
		issues.push(
			...checkRange(input.averageKmPerDay, inputRanges.averageKmPerDay, 'averageKmPerDay')
		);
	} else if (issues.length === 0 && today !== null && start !== null) {
		issues.push(...checkEstimatedAverage(input, today - start));
	}
	return issues;
}

function odometerRange(label: string) {
	return { ...inputRanges.odometerKm, label };
}

/** Readings that imply more than MAX_KM_PER_DAY are a typing slip, not a vehicle's use. */
function checkEstimatedAverage(
	input: ServiceIntervalInput,
	elapsedDays: number
): CalculatorIssue[] {
	if (elapsedDays < MIN_DAYS_FOR_ESTIMATE) return [];
	const startKm = input.lastChange.kind === 'changed' ? input.lastChange.odometerKm : 0;
	const average = (input.currentOdometerKm - startKm) / elapsedDays;
	if (average <= MAX_KM_PER_DAY) return [];
	return [
		{
			path: 'currentOdometerKm',
			message: `These readings mean ${formatNumber(average, 0)} km a day, more than the ${formatNumber(MAX_KM_PER_DAY)} km a vehicle can cover: check the odometer readings and dates.`
		}
	];
}

/** Further ahead than this a projected date means nothing: the time limit falls first anyway. */
const MAX_PROJECTION_DAYS = 36_525;

type Limits = {
	today: number;
	timeDueDay: number;
	dueOdometerKm: number;
	kmRemaining: number;
	averageKmPerDay: number | null;
	distanceDueDay: number | null;
};

/** Where the limits fall: the due odometer, the time limit, and the average use if known. */
function findLimits(input: ServiceIntervalInput, settings: IntervalSettings, steps: string[]) {
	const last = input.lastChange;
	const today = parseIsoDate(input.currentDate) as number;
	const startDay = parseIsoDate(last.kind === 'changed' ? last.date : last.inServiceDate) as number;
	// A vehicle never changed is counted from new: its first limit is an odometer reading.
	const startOdometerKm = last.kind === 'changed' ? last.odometerKm : 0;
	const dueOdometerKm =
		last.kind === 'changed' ? last.odometerKm + settings.thenEveryKm : settings.firstChangeKm;
	const timeDueDay = addMonths(startDay, settings.everyMonths);
	steps.push(
		last.kind === 'changed'
			? `Last change on ${last.date} at ${formatNumber(last.odometerKm, 0)} km: the next is due at ${formatNumber(dueOdometerKm, 0)} km (+${formatNumber(settings.thenEveryKm, 0)} km) or on ${formatIsoDate(timeDueDay)} (+${settings.everyMonths} months), whichever comes first.`
			: `Never changed since ${last.inServiceDate}: the first change is due at ${formatNumber(dueOdometerKm, 0)} km or on ${formatIsoDate(timeDueDay)} (+${settings.everyMonths} months), whichever comes first.`
	);
	let averageKmPerDay: number | null = input.averageKmPerDay ?? null;
	const elapsedDays = today - startDay;
	if (averageKmPerDay === null && elapsedDays >= MIN_DAYS_FOR_ESTIMATE) {
		averageKmPerDay = (input.currentOdometerKm - startOdometerKm) / elapsedDays;
		steps.push(
			`Average use estimated from ${formatNumber(input.currentOdometerKm - startOdometerKm, 0)} km in ${formatNumber(elapsedDays, 0)} days${last.kind === 'never' ? ' (counted from 0 km at the in-service date)' : ''}: ${formatNumber(averageKmPerDay, 1)} km a day.`
		);
	}
	const kmRemaining = dueOdometerKm - input.currentOdometerKm;
	return { today, timeDueDay, dueOdometerKm, kmRemaining, averageKmPerDay };
}

/** The day the odometer reaches the limit at the average use, or null when it cannot be told. */
function projectDistanceDay(
	limits: Omit<Limits, 'distanceDueDay'>,
	steps: string[],
	warnings: string[]
): number | null {
	const { today, kmRemaining, averageKmPerDay, dueOdometerKm } = limits;
	if (averageKmPerDay === null || averageKmPerDay === 0) {
		warnings.push(
			averageKmPerDay === 0
				? 'The vehicle is not being driven, so only the time limit can fall due.'
				: 'Without an average distance per day the date of the distance limit cannot be projected; give one to see which limit comes first.'
		);
		return null;
	}
	// Rounded up to whole days so the projected day is never before the limit is reached.
	const days = Math.ceil(kmRemaining / averageKmPerDay);
	// Written as "not within" so that an infinite day count (a tiny average) is caught too.
	if (!(Math.abs(days) <= MAX_PROJECTION_DAYS)) {
		warnings.push(
			kmRemaining < 0
				? `At ${formatNumber(averageKmPerDay, 1)} km a day the date the distance limit was passed cannot be told: it would lie more than 100 years back.`
				: `At ${formatNumber(averageKmPerDay, 1)} km a day the distance limit is more than 100 years away, so the time limit falls first.`
		);
		return null;
	}
	const distanceDueDay = today + days;
	steps.push(
		`At ${formatNumber(averageKmPerDay, 1)} km a day the odometer reaches ${formatNumber(dueOdometerKm, 0)} km on about ${formatIsoDate(distanceDueDay)}.`
	);
	return distanceDueDay;
}

function findFirstLimit(limits: Limits): FirstLimit {
	const { distanceDueDay, timeDueDay, averageKmPerDay, kmRemaining, today } = limits;
	if (distanceDueDay !== null) return distanceDueDay < timeDueDay ? 'distance' : 'time';
	if (averageKmPerDay !== null) return 'time';
	if (kmRemaining < 0 && today <= timeDueDay) return 'distance';
	if (today > timeDueDay && kmRemaining >= 0) return 'time';
	return 'unknown';
}

function findStatus(limits: Limits, daysRemaining: number, settings: IntervalSettings) {
	if (limits.today > limits.timeDueDay || limits.kmRemaining < 0) return 'overdue';
	if (daysRemaining <= settings.dueSoonDays || limits.kmRemaining <= settings.dueSoonKm) {
		return 'due_soon';
	}
	return 'ok';
}

export function calculateServiceInterval(
	input: ServiceIntervalInput
): CalculatorResult<ServiceIntervalValues> {
	throwIfIssues(checkServiceIntervalInput(input));
	const settings = resolveSettings(input.settings);
	const steps: string[] = [];
	const warnings: string[] = [];
	const found = findLimits(input, settings, steps);
	const limits: Limits = { ...found, distanceDueDay: projectDistanceDay(found, steps, warnings) };
	const { today, timeDueDay, distanceDueDay, kmRemaining, averageKmPerDay } = limits;
	const dueDay = distanceDueDay === null ? timeDueDay : Math.min(timeDueDay, distanceDueDay);
	const daysRemaining = dueDay - today;
	const status: ServiceStatus = findStatus(limits, daysRemaining, settings);
	steps.push(
		status === 'overdue'
			? `Overdue: ${kmRemaining < 0 ? `${formatNumber(-kmRemaining, 0)} km past the distance limit` : `${formatNumber(today - timeDueDay, 0)} days past the time limit`}.`
			: `${formatNumber(daysRemaining, 0)} days and ${formatNumber(kmRemaining, 0)} km remain (due soon within ${settings.dueSoonDays} days or ${formatNumber(settings.dueSoonKm, 0)} km).`
	);
	return {
		values: {
			status,
			firstLimit: findFirstLimit(limits),
			dueDate: formatIsoDate(dueDay),
			timeDueDate: formatIsoDate(timeDueDay),
			distanceDueDate: distanceDueDay === null ? null : formatIsoDate(distanceDueDay),
			dueOdometer: toQuantity(limits.dueOdometerKm, 'km', 0),
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
