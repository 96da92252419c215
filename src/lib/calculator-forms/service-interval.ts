// The service-interval calculator's form.
import {
	CAUTION_COOLANT_POISON,
	CAUTION_FOLLOW_PROCEDURE,
	type Quantity,
	type ServiceIntervalValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import { show, type DisplayRow } from './display';
import { readFormNumber, type FieldSpec } from './fields';

/** When the next coolant change is due. Dates are written and shown one way: YYYY-MM-DD. */
const DATE_HINT = 'Written as YYYY-MM-DD, for example 2024-03-31.';
const settingNames = ['firstChangeKm', 'thenEveryKm', 'everyMonths', 'dueSoonDays', 'dueSoonKm'];

const statusLabels: Record<ServiceIntervalValues['status'], string> = {
	ok: 'Not due yet',
	due_soon: 'Due soon',
	overdue: 'Overdue'
};
const statusTones: Record<ServiceIntervalValues['status'], DisplayRow['tone']> = {
	ok: 'ok',
	due_soon: 'caution',
	overdue: 'alarm'
};
const firstLimitLabels: Record<ServiceIntervalValues['firstLimit'], string> = {
	distance: 'the distance limit comes first',
	time: 'the time limit comes first',
	unknown: 'give an average distance per day to see which limit comes first'
};

const km = (name: string, label: string, required = false): FieldSpec => ({
	kind: 'number',
	name,
	label,
	required
});

const fields: FieldSpec[] = [
	{
		kind: 'choice',
		name: 'lastChangeKind',
		label: 'The coolant has',
		options: [
			{ value: 'changed', label: 'Been changed before' },
			{ value: 'never', label: 'Never been changed' }
		]
	},
	{
		kind: 'group',
		name: 'lastChange',
		columns: 2,
		showWhen: { field: 'lastChangeKind', value: 'changed' },
		fields: [
			{ kind: 'date', name: 'lastChangeDate', label: 'Date of the last change', hint: DATE_HINT },
			km('lastChangeOdometerKm', 'Odometer at the last change (km)')
		]
	},
	{
		kind: 'date',
		name: 'inServiceDate',
		label: 'In-service date (first registered)',
		hint: DATE_HINT,
		showWhen: { field: 'lastChangeKind', value: 'never' }
	},
	{
		kind: 'group',
		name: 'now',
		columns: 2,
		fields: [
			{ kind: 'date', name: 'currentDate', label: "Today's date", required: true, hint: DATE_HINT },
			km('currentOdometerKm', 'Odometer now (km)', true)
		]
	},
	{
		kind: 'number',
		name: 'averageKmPerDay',
		label: 'Average distance per day (km, optional)',
		hint: 'Left empty, it is worked out from the dates and odometer readings.'
	},
	{
		kind: 'group',
		name: 'interval',
		legend: 'Change interval',
		hint: "Filled in from your shop's settings; change them here for this vehicle only. The vehicle maker's schedule comes first.",
		columns: 3,
		fields: [
			km('firstChangeKm', 'First change at (km)'),
			km('thenEveryKm', 'Then every (km)'),
			km('everyMonths', 'Or every (months)'),
			km('dueSoonDays', 'Due soon within (days)'),
			km('dueSoonKm', 'Due soon within (km)')
		]
	}
];

function presentRows(v: ServiceIntervalValues): DisplayRow[] {
	const past = (quantity: Quantity) => show({ ...quantity, value: -quantity.value });
	const rows: DisplayRow[] = [
		{ key: 'status', label: 'Status', text: statusLabels[v.status], tone: statusTones[v.status] },
		{ key: 'dueDate', label: 'Due by', text: v.dueDate, also: firstLimitLabels[v.firstLimit] },
		{ key: 'dueOdometer', label: 'Due at', text: show(v.dueOdometer) },
		v.daysRemaining.value < 0
			? { key: 'daysRemaining', label: 'Past the due date by', text: past(v.daysRemaining) }
			: { key: 'daysRemaining', label: 'Time left', text: show(v.daysRemaining) },
		v.kmRemaining.value < 0
			? { key: 'kmRemaining', label: 'Past the distance limit by', text: past(v.kmRemaining) }
			: { key: 'kmRemaining', label: 'Distance left', text: show(v.kmRemaining) },
		{ key: 'timeDueDate', label: 'Time limit', text: v.timeDueDate }
	];
	if (v.distanceDueDate) {
		rows.push({
			key: 'distanceDueDate',
			label: 'Distance limit (projected)',
			text: v.distanceDueDate
		});
	}
	if (v.averageDistance) {
		rows.push({ key: 'averageDistance', label: 'Average use', text: show(v.averageDistance) });
	}
	return rows;
}

export const serviceIntervalForm: CalculatorFormDefinition = {
	calculator: 'service-interval',
	action: 'serviceInterval',
	short: 'Next coolant change',
	cautions: [CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
	fields,
	defaults: ({ today, intervals }) => ({
		lastChangeKind: 'changed',
		lastChangeDate: '',
		lastChangeOdometerKm: '',
		inServiceDate: '',
		currentDate: today,
		currentOdometerKm: '',
		averageKmPerDay: '',
		...Object.fromEntries(
			settingNames.map((name) => [name, String(intervals[name as keyof typeof intervals])])
		)
	}),
	fieldOf: {
		lastChange: 'lastChangeKind',
		'lastChange.kind': 'lastChangeKind',
		'lastChange.date': 'lastChangeDate',
		'lastChange.odometerKm': 'lastChangeOdometerKm',
		'lastChange.inServiceDate': 'inServiceDate',
		currentDate: 'currentDate',
		currentOdometerKm: 'currentOdometerKm',
		averageKmPerDay: 'averageKmPerDay',
		...Object.fromEntries(settingNames.map((name) => [`settings.${name}`, name]))
	},
	toInput(values) {
		// A setting left empty falls back to the shop's own (filled in by the server module).
		const settings = Object.fromEntries(
			settingNames
				.map((name) => [name, readFormNumber(values[name])] as const)
				.filter(([, value]) => value !== undefined)
		);
		const lastChange =
			values.lastChangeKind === 'never'
				? { kind: 'never', inServiceDate: values.inServiceDate || undefined }
				: {
						kind: 'changed',
						date: values.lastChangeDate || undefined,
						odometerKm: readFormNumber(values.lastChangeOdometerKm)
					};
		return {
			input: {
				lastChange,
				currentDate: values.currentDate || undefined,
				currentOdometerKm: readFormNumber(values.currentOdometerKm),
				averageKmPerDay: readFormNumber(values.averageKmPerDay),
				settings
			},
			errors: {}
		};
	},
	present: (result) => presentRows(result.values as ServiceIntervalValues)
};
