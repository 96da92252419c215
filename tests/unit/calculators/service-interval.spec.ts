import { describe, expect, it } from 'vitest';
import {
	addMonths,
	calculateServiceInterval,
	DEFAULT_INTERVAL_SETTINGS,
	formatIsoDate,
	parseIsoDate,
	type ServiceIntervalInput
} from '../../../src/lib/calculators';
import { expectCalculatorError } from './helpers';

// Day counts and dates in these cases were counted with Python's datetime module.

function makeChangedInput(overrides: Partial<ServiceIntervalInput> = {}): ServiceIntervalInput {
	return {
		lastChange: { kind: 'changed', date: '2020-02-29', odometerKm: 100_000 },
		currentDate: '2024-12-01',
		currentOdometerKm: 110_000,
		...overrides
	};
}

function shiftMonths(isoDate: string, months: number): string {
	return formatIsoDate(addMonths(parseIsoDate(isoDate) as number, months));
}

describe('default intervals', () => {
	it('are 160,000 km first, then every 80,000 km or 60 months (common practice, no source)', () => {
		// reference.md: long-life coolant is commonly first replaced around 160,000 km
		// (100,000 miles), then about every 80,000 km (50,000 miles).
		expect(DEFAULT_INTERVAL_SETTINGS).toMatchObject({
			firstChangeKm: 160_000,
			thenEveryKm: 80_000,
			everyMonths: 60,
			dueSoonDays: 30,
			dueSoonKm: 2_000
		});
		const result = calculateServiceInterval(makeChangedInput());
		expect(result.basis).toMatch(/common practice .*no published source/);
	});
});

describe('calendar months', () => {
	it('falls back to the last day of a shorter month', () => {
		expect(shiftMonths('2024-01-31', 1)).toBe('2024-02-29');
		expect(shiftMonths('2023-01-31', 1)).toBe('2023-02-28');
		expect(shiftMonths('2020-02-29', 60)).toBe('2025-02-28');
		expect(shiftMonths('2020-02-29', 48)).toBe('2024-02-29');
		expect(shiftMonths('2023-11-15', 3)).toBe('2024-02-15');
	});

	it('accepts only real dates written as YYYY-MM-DD', () => {
		expect(parseIsoDate('2024-02-29')).not.toBeNull();
		expect(parseIsoDate('2023-02-29')).toBeNull();
		expect(parseIsoDate('2023-13-01')).toBeNull();
		expect(parseIsoDate('1/2/2023')).toBeNull();
	});
});

describe('next change due', () => {
	it('counts a never-changed vehicle from its in-service date to the first-change distance', () => {
		// 150,000 km in 1,599 days is 93.8 km a day; the last 10,000 km take 107 days.
		const result = calculateServiceInterval({
			lastChange: { kind: 'never', inServiceDate: '2020-01-15' },
			currentDate: '2024-06-01',
			currentOdometerKm: 150_000
		});
		expect(result.values.dueOdometer).toEqual({ value: 160_000, unit: 'km' });
		expect(result.values.timeDueDate).toBe('2025-01-15');
		expect(result.values.averageDistance).toEqual({ value: 93.8, unit: 'km/day' });
		expect(result.values.distanceDueDate).toBe('2024-09-16');
		expect(result.values.dueDate).toBe('2024-09-16');
		expect(result.values.firstLimit).toBe('distance');
		expect(result.values.daysRemaining).toEqual({ value: 107, unit: 'days' });
		expect(result.values.status).toBe('ok');
	});

	it('lets time come first for a little-used vehicle', () => {
		const result = calculateServiceInterval(makeChangedInput());
		expect(result.values.dueOdometer).toEqual({ value: 180_000, unit: 'km' });
		expect(result.values.timeDueDate).toBe('2025-02-28');
		expect(result.values.dueDate).toBe('2025-02-28');
		expect(result.values.firstLimit).toBe('time');
		expect(result.values.daysRemaining).toEqual({ value: 89, unit: 'days' });
		expect(result.values.kmRemaining).toEqual({ value: 70_000, unit: 'km' });
		expect(result.values.status).toBe('ok');
	});

	it('is due soon within 30 days of the time limit', () => {
		const result = calculateServiceInterval(
			makeChangedInput({ currentDate: '2025-02-10', currentOdometerKm: 110_500 })
		);
		expect(result.values.daysRemaining.value).toBe(18);
		expect(result.values.status).toBe('due_soon');
	});

	it('is due soon within 2,000 km of the distance limit, with a projected date', () => {
		const result = calculateServiceInterval({
			lastChange: { kind: 'changed', date: '2023-01-10', odometerKm: 50_000 },
			currentDate: '2024-01-10',
			currentOdometerKm: 128_500,
			averageKmPerDay: 200
		});
		expect(result.values.kmRemaining).toEqual({ value: 1_500, unit: 'km' });
		expect(result.values.distanceDueDate).toBe('2024-01-18');
		expect(result.values.firstLimit).toBe('distance');
		expect(result.values.status).toBe('due_soon');
	});

	it('is overdue once the odometer passes the limit', () => {
		const result = calculateServiceInterval({
			lastChange: { kind: 'changed', date: '2023-01-10', odometerKm: 50_000 },
			currentDate: '2024-01-10',
			currentOdometerKm: 131_000,
			averageKmPerDay: 200
		});
		expect(result.values.status).toBe('overdue');
		expect(result.values.kmRemaining).toEqual({ value: -1_000, unit: 'km' });
		expect(result.values.firstLimit).toBe('distance');
		expect(result.steps?.join(' ')).toMatch(/1,000 km past the distance limit/);
	});

	it('is overdue once the date passes the time limit', () => {
		const result = calculateServiceInterval({
			lastChange: { kind: 'changed', date: '2018-05-01', odometerKm: 20_000 },
			currentDate: '2023-06-01',
			currentOdometerKm: 60_000
		});
		expect(result.values.timeDueDate).toBe('2023-05-01');
		expect(result.values.status).toBe('overdue');
		expect(result.values.firstLimit).toBe('time');
		expect(result.steps?.join(' ')).toMatch(/31 days past the time limit/);
	});

	it('cannot tell which limit comes first from a short history without an average', () => {
		const result = calculateServiceInterval({
			lastChange: { kind: 'changed', date: '2024-05-20', odometerKm: 100_000 },
			currentDate: '2024-06-01',
			currentOdometerKm: 100_500
		});
		expect(result.values.firstLimit).toBe('unknown');
		expect(result.values.distanceDueDate).toBeNull();
		expect(result.values.dueDate).toBe('2029-05-20');
		expect(result.warnings.join(' ')).toMatch(/cannot be projected/);
	});

	it('treats a parked vehicle as time-limited', () => {
		const result = calculateServiceInterval(makeChangedInput({ averageKmPerDay: 0 }));
		expect(result.values.firstLimit).toBe('time');
		expect(result.warnings.join(' ')).toMatch(/not being driven/);
	});

	it('follows the shop’s own settings', () => {
		const result = calculateServiceInterval(
			makeChangedInput({ settings: { dueSoonDays: 120, everyMonths: 48 } })
		);
		expect(result.values.timeDueDate).toBe('2024-02-29');
		expect(result.values.status).toBe('overdue');
		const soon = calculateServiceInterval(makeChangedInput({ settings: { dueSoonDays: 120 } }));
		expect(soon.values.status).toBe('due_soon');
	});
});

describe('service interval errors', () => {
	it('rejects an odometer lower than at the last change', () => {
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ currentOdometerKm: 90_000 })),
			'The current odometer (90,000 km) is lower than at the last coolant change (100,000 km).',
			'currentOdometerKm'
		);
	});

	it('rejects a last change after today and a date that does not exist', () => {
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ currentDate: '2019-12-31' })),
			'The last coolant change (2020-02-29) cannot be after today (2019-12-31).',
			'lastChange.date'
		);
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ currentDate: '2023-02-30' })),
			"Today's date must be a real date written as YYYY-MM-DD.",
			'currentDate'
		);
		expectCalculatorError(
			() =>
				calculateServiceInterval({
					lastChange: { kind: 'never', inServiceDate: '2030-01-01' },
					currentDate: '2024-01-01',
					currentOdometerKm: 10
				}),
			/in-service date \(2030-01-01\) cannot be after today/
		);
	});

	it('rejects an impossible average distance and bad settings', () => {
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ averageKmPerDay: -5 })),
			'Average distance must be between 0 and 2,000 km a day.'
		);
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ settings: { everyMonths: 0 } })),
			'Time interval must be a whole number from 1 to 240 months.',
			'settings.everyMonths'
		);
		expectCalculatorError(
			() => calculateServiceInterval(makeChangedInput({ settings: { thenEveryKm: 1.5 } })),
			/Change interval must be a whole number/
		);
	});
});
