import {
	CalculatorError,
	convertPressure,
	convertTemperature,
	convertVolume,
	findFreshFraction,
	formatNumber,
	freezeTables,
	interpolateFreezePointC,
	pressureUnits,
	temperatureUnits,
	torqueUnits,
	volumeUnits,
	type AdjustMixValues,
	type BoilingPointValues,
	type CalculatorName,
	type CalculatorResult,
	type ConversionValues,
	type DrainFillValues,
	type FreezePointValues,
	type FreezeTableId,
	type IntervalSettings,
	type Quantity,
	type ServiceIntervalValues,
	type VolumeUnit
} from '$lib/calculators';

/**
 * The page's forms for the calculators: form strings (in the units a technician picked) become
 * the calculators' JSON input (numbers, litres, °C), and a result becomes rows a person reads,
 * every number with its unit. The calculators themselves decide what is valid.
 */
export type FormValues = Record<string, string>;
export type FieldErrors = Record<string, string>;

export type DisplayRow = {
	key: string;
	label: string;
	/** The value with its unit, in the unit the person chose. */
	text: string;
	/** The same value in the other common unit. */
	also?: string;
	/** Marks a status that needs attention. */
	tone?: 'ok' | 'caution' | 'alarm';
};

export type FreezeMarker = { percent: number; freezePointC: number; label: string };

export type ResultChart =
	| { kind: 'freeze'; table: FreezeTableId; markers: FreezeMarker[] }
	| {
			kind: 'fresh';
			bars: { cycle: number; freshPercent: number }[];
			targetPercent: number | null;
			/** Cycles beyond the last bar, left out to keep the chart readable. */
			moreCycles: number;
	  };

export type Presentation = { rows: DisplayRow[]; chart?: ResultChart };

/** What an action answers: the result and its rows, or the message and field errors. */
export type FormOutcome = {
	calculator: CalculatorName;
	values: FormValues;
	message?: string;
	errors?: FieldErrors;
	result?: CalculatorResult;
	rows?: DisplayRow[];
	chart?: ResultChart;
};

export interface CalculatorForm {
	calculator: CalculatorName;
	/** The posted fields this form reads and echoes back. */
	fields: readonly string[];
	toInput(values: FormValues): { input: unknown; errors: FieldErrors };
	/** Where a calculator's issue path is shown on the form. */
	fieldOf: Readonly<Record<string, string>>;
	present(result: CalculatorResult, values: FormValues): Presentation;
}

export const temperatureChoices = ['°C', '°F'] as const;
export const volumeChoices = ['L', 'US qt', 'US gal', 'UK gal'] as const;
export const pressureChoices = ['kPa', 'psi', 'bar'] as const;
export const altitudeChoices = ['m', 'ft'] as const;
type TemperatureChoice = (typeof temperatureChoices)[number];

/** 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B). */
const METRES_PER_FOOT = 0.3048;
/** More bars than this stop being readable at tablet width. */
const MAX_BARS = 12;

const NUMBER_PATTERN = /^[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?$/;

/** Reads only this form's fields, and only as text: a file or a repeated field counts as empty. */
export function readFormValues(formData: FormData, fields: readonly string[]): FormValues {
	const values: FormValues = {};
	for (const field of fields) {
		const all = formData.getAll(field);
		values[field] = all.length === 1 && typeof all[0] === 'string' ? all[0].slice(0, 100) : '';
	}
	return values;
}

/**
 * An empty field is left out (the calculator then says it is required or uses its default); text
 * that is not a number becomes NaN so the calculator reports it at its field, never as 0.
 */
function readNumber(values: FormValues, field: string): number | undefined {
	const text = (values[field] ?? '').trim().replace(/^\u2212/, '-');
	if (text === '') return undefined;
	return NUMBER_PATTERN.test(text) ? Number(text) : Number.NaN;
}

function readChoice<T extends string>(
	values: FormValues,
	field: string,
	choices: readonly T[],
	errors: FieldErrors
): T {
	const value = values[field];
	if ((choices as readonly string[]).includes(value)) return value as T;
	errors[field] = `Choose one of: ${choices.join(', ')}.`;
	return choices[0];
}

/** Reads a number and converts it to the calculator's unit; a refused conversion is a field error. */
function readConverted(
	values: FormValues,
	field: string,
	errors: FieldErrors,
	convert: (value: number) => number
): number | undefined {
	const value = readNumber(values, field);
	if (value === undefined || !Number.isFinite(value)) return value;
	try {
		return convert(value);
	} catch (error) {
		if (!(error instanceof CalculatorError)) throw error;
		errors[field] = error.message;
		return Number.NaN;
	}
}

const toCelsius = (unit: TemperatureChoice) => (value: number) =>
	convertTemperature(value, unit, '°C');
const toLitres = (unit: VolumeUnit) => (value: number) => convertVolume(value, unit, 'L');

function showTemperature(
	quantity: Quantity,
	unit: TemperatureChoice,
	decimalsC = 2
): Pick<DisplayRow, 'text' | 'also'> {
	const celsius = `${formatNumber(quantity.value, decimalsC)} °C`;
	const fahrenheit = `${formatNumber(convertTemperature(quantity.value, '°C', '°F'), 1)} °F`;
	return unit === '°F' ? { text: fahrenheit, also: celsius } : { text: celsius, also: fahrenheit };
}

function showVolume(litres: Quantity, unit: VolumeUnit): Pick<DisplayRow, 'text' | 'also'> {
	const inLitres = `${formatNumber(litres.value, 2)} L`;
	if (unit === 'L') return { text: inLitres };
	return {
		text: `${formatNumber(convertVolume(litres.value, 'L', unit), 2)} ${unit}`,
		also: inLitres
	};
}

const show = (quantity: Quantity, decimals = 2) =>
	`${formatNumber(quantity.value, decimals)} ${quantity.unit}`;

const choiceOf = <T extends string>(values: FormValues, field: string, choices: readonly T[]) =>
	(choices as readonly string[]).includes(values[field]) ? (values[field] as T) : choices[0];

function markerIfInTable(
	table: FreezeTableId,
	percent: number,
	freezePointC: number | null,
	label: string
): FreezeMarker[] {
	const points = freezeTables[table].points;
	const inRange = percent >= points[0].percent && percent <= points[points.length - 1].percent;
	return inRange && freezePointC !== null ? [{ percent, freezePointC, label }] : [];
}

export const freezePointForm: CalculatorForm = {
	calculator: 'freeze-point',
	fields: ['glycol', 'basis', 'percent', 'temperatureUnit'],
	fieldOf: { glycol: 'glycol', basis: 'basis', percent: 'percent' },
	toInput(values) {
		const errors: FieldErrors = {};
		readChoice(values, 'temperatureUnit', temperatureChoices, errors);
		return {
			input: { glycol: values.glycol, basis: values.basis, percent: readNumber(values, 'percent') },
			errors
		};
	},
	present(result, values) {
		const v = result.values as FreezePointValues;
		const unit = choiceOf(values, 'temperatureUnit', temperatureChoices);
		return {
			rows: [
				{ key: 'freezePoint', label: 'Freeze point', ...showTemperature(v.freezePoint, unit) },
				{ key: 'concentration', label: 'Glycol concentration', text: show(v.concentration, 1) },
				{ key: 'table', label: 'Table', text: freezeTables[v.table].title },
				{
					key: 'interpolated',
					label: 'From the table',
					text: v.interpolated ? 'between two table points (interpolated)' : 'a printed table point'
				}
			],
			chart: {
				kind: 'freeze',
				table: v.table,
				markers: [
					{
						percent: v.concentration.value,
						freezePointC: v.freezePoint.value,
						label: 'This mix'
					}
				]
			}
		};
	}
};

export const glycolForFreezePointForm: CalculatorForm = {
	calculator: 'glycol-for-freeze-point',
	fields: ['glycol', 'basis', 'freezePoint', 'temperatureUnit'],
	fieldOf: { glycol: 'glycol', basis: 'basis', freezePointC: 'freezePoint' },
	toInput(values) {
		const errors: FieldErrors = {};
		const unit = readChoice(values, 'temperatureUnit', temperatureChoices, errors);
		return {
			input: {
				glycol: values.glycol,
				basis: values.basis,
				freezePointC: readConverted(values, 'freezePoint', errors, toCelsius(unit))
			},
			errors
		};
	},
	present(result, values) {
		const v = result.values as FreezePointValues;
		const unit = choiceOf(values, 'temperatureUnit', temperatureChoices);
		return {
			rows: [
				{ key: 'concentration', label: 'Glycol needed', text: show(v.concentration, 1) },
				{ key: 'freezePoint', label: 'Protects down to', ...showTemperature(v.freezePoint, unit) },
				{ key: 'table', label: 'Table', text: freezeTables[v.table].title }
			],
			chart: {
				kind: 'freeze',
				table: v.table,
				markers: [
					{
						percent: v.concentration.value,
						freezePointC: v.freezePoint.value,
						label: 'Needed'
					}
				]
			}
		};
	}
};

const fluidLabels: Record<AdjustMixValues['addFluid'], string> = {
	concentrate: 'Then add concentrate',
	premix: 'Then add premixed coolant',
	water: 'Then add water',
	none: 'Then add'
};

export const mixAdjustmentForm: CalculatorForm = {
	calculator: 'mix-adjustment',
	fields: [
		'glycol',
		'capacity',
		'volumeUnit',
		'currentKnownAs',
		'currentPercent',
		'currentFreezePoint',
		'targetFreezePoint',
		'temperatureUnit',
		'refillPercent'
	],
	fieldOf: {
		glycol: 'glycol',
		capacityL: 'capacity',
		currentPercent: 'currentPercent',
		currentFreezePointC: 'currentFreezePoint',
		targetFreezePointC: 'targetFreezePoint',
		refillPercent: 'refillPercent'
	},
	toInput(values) {
		const errors: FieldErrors = {};
		const volumeUnit = readChoice(values, 'volumeUnit', volumeChoices, errors);
		const temperatureUnit = readChoice(values, 'temperatureUnit', temperatureChoices, errors);
		const knownAs = readChoice(values, 'currentKnownAs', ['freezePoint', 'percent'], errors);
		return {
			input: {
				glycol: values.glycol,
				capacityL: readConverted(values, 'capacity', errors, toLitres(volumeUnit)),
				// Only the way the person chose counts; the other field may still hold an old value.
				...(knownAs === 'percent'
					? { currentPercent: readNumber(values, 'currentPercent') }
					: {
							currentFreezePointC: readConverted(
								values,
								'currentFreezePoint',
								errors,
								toCelsius(temperatureUnit)
							)
						}),
				targetFreezePointC: readConverted(
					values,
					'targetFreezePoint',
					errors,
					toCelsius(temperatureUnit)
				),
				refillPercent: readNumber(values, 'refillPercent')
			},
			errors
		};
	},
	present(result, values) {
		const v = result.values as AdjustMixValues;
		const volumeUnit = choiceOf(values, 'volumeUnit', volumeChoices);
		const temperatureUnit = choiceOf(values, 'temperatureUnit', temperatureChoices);
		const rows: DisplayRow[] = [
			{ key: 'drain', label: 'Drain', ...showVolume(v.drain, volumeUnit) },
			v.addFluid === 'none'
				? { key: 'add', label: fluidLabels.none, text: 'nothing: the mix is on target' }
				: { key: 'add', label: fluidLabels[v.addFluid], ...showVolume(v.add, volumeUnit) },
			{ key: 'currentConcentration', label: 'Current mix', text: show(v.currentConcentration, 1) }
		];
		if (v.currentFreezePoint) {
			rows.push({
				key: 'currentFreezePoint',
				label: 'Current mix freezes at',
				...showTemperature(v.currentFreezePoint, temperatureUnit, 1)
			});
		}
		rows.push(
			{ key: 'targetConcentration', label: 'Target mix', text: show(v.targetConcentration, 1) },
			{
				key: 'targetFreezePoint',
				label: 'Target freezes at',
				...showTemperature(v.targetFreezePoint, temperatureUnit, 1)
			}
		);
		return {
			rows,
			chart: {
				kind: 'freeze',
				table: v.table,
				markers: [
					...markerIfInTable(
						v.table,
						v.currentConcentration.value,
						v.currentFreezePoint?.value ?? null,
						'Now'
					),
					{
						percent: v.targetConcentration.value,
						freezePointC: v.targetFreezePoint.value,
						label: 'Target'
					}
				]
			}
		};
	}
};

function readDrainFillInput(values: FormValues) {
	const errors: FieldErrors = {};
	const unit = readChoice(values, 'volumeUnit', volumeChoices, errors);
	return {
		input: {
			capacityL: readConverted(values, 'capacity', errors, toLitres(unit)),
			drainL: readConverted(values, 'drain', errors, toLitres(unit)),
			cycles: readNumber(values, 'cycles'),
			targetFreshPercent: readNumber(values, 'targetFresh')
		},
		errors
	};
}

export const drainAndFillForm: CalculatorForm = {
	calculator: 'drain-and-fill',
	fields: ['capacity', 'drain', 'volumeUnit', 'cycles', 'targetFresh'],
	fieldOf: {
		capacityL: 'capacity',
		drainL: 'drain',
		cycles: 'cycles',
		targetFreshPercent: 'targetFresh'
	},
	toInput: readDrainFillInput,
	present(result, values) {
		const v = result.values as DrainFillValues;
		const unit = choiceOf(values, 'volumeUnit', volumeChoices);
		const rows: DisplayRow[] = [
			{ key: 'renewedPerCycle', label: 'Renewed per cycle', text: show(v.renewedPerCycle, 1) }
		];
		if (v.cycles && v.freshAfterCycles) {
			rows.push({
				key: 'freshAfterCycles',
				label: `Fresh coolant after ${v.cycles.value} cycle${v.cycles.value === 1 ? '' : 's'}`,
				text: show(v.freshAfterCycles, 1)
			});
		}
		if (v.cyclesNeeded && v.freshAfterCyclesNeeded) {
			rows.push(
				{
					key: 'cyclesNeeded',
					label: 'Cycles needed for the target',
					text: show(v.cyclesNeeded, 0)
				},
				{
					key: 'freshAfterCyclesNeeded',
					label: 'Fresh coolant after those cycles',
					text: show(v.freshAfterCyclesNeeded, 1)
				}
			);
		}
		if (v.coolantNeeded) {
			rows.push({
				key: 'coolantNeeded',
				label: 'Fresh coolant to have ready',
				...showVolume(v.coolantNeeded, unit)
			});
		}
		// The bars come from the same formula the calculator used, one per cycle.
		const { capacityL, drainL } = readDrainFillInput(values).input as {
			capacityL: number;
			drainL: number;
		};
		const totalCycles = Math.max(v.cycles?.value ?? 0, v.cyclesNeeded?.value ?? 0);
		const shown = Math.min(totalCycles, MAX_BARS);
		const bars = Array.from({ length: shown }, (_, i) => ({
			cycle: i + 1,
			freshPercent: findFreshFraction(capacityL, drainL, i + 1) * 100
		}));
		const target = readNumber(values, 'targetFresh');
		return {
			rows,
			chart:
				bars.length === 0
					? undefined
					: {
							kind: 'fresh',
							bars,
							targetPercent: target === undefined ? null : target,
							moreCycles: totalCycles - shown
						}
		};
	}
};

export const boilingPointForm: CalculatorForm = {
	calculator: 'boiling-point',
	fields: [
		'capValue',
		'capUnit',
		'altitude',
		'altitudeUnit',
		'coolant',
		'glycolPercent',
		'glycolBasis',
		'temperatureUnit'
	],
	fieldOf: {
		'capGauge.value': 'capValue',
		'capGauge.unit': 'capUnit',
		altitudeM: 'altitude',
		'glycol.type': 'coolant',
		'glycol.percent': 'glycolPercent',
		'glycol.basis': 'glycolBasis'
	},
	toInput(values) {
		const errors: FieldErrors = {};
		const capUnit = readChoice(values, 'capUnit', pressureChoices, errors);
		const altitudeUnit = readChoice(values, 'altitudeUnit', altitudeChoices, errors);
		const coolant = readChoice(values, 'coolant', ['EG', 'water'], errors);
		readChoice(values, 'temperatureUnit', temperatureChoices, errors);
		const altitude = readNumber(values, 'altitude');
		return {
			input: {
				capGauge: { value: readNumber(values, 'capValue'), unit: capUnit },
				altitudeM:
					altitude === undefined || altitudeUnit === 'm' ? altitude : altitude * METRES_PER_FOOT,
				glycol:
					coolant === 'EG'
						? {
								type: 'EG',
								percent: readNumber(values, 'glycolPercent'),
								basis: values.glycolBasis
							}
						: undefined
			},
			errors
		};
	},
	present(result, values) {
		const v = result.values as BoilingPointValues;
		const unit = choiceOf(values, 'temperatureUnit', temperatureChoices);
		const capUnit = choiceOf(values, 'capUnit', pressureChoices);
		const low = showTemperature(v.boilingPointIfCapOpensLow, unit, 1);
		const high = showTemperature(v.boilingPointIfCapOpensHigh, unit, 1);
		const rows: DisplayRow[] = [
			{
				key: 'boilingPoint',
				label: 'Boils at, cap holding',
				...showTemperature(v.boilingPoint, unit)
			}
		];
		if (v.glycolMassPercent) {
			rows.push({
				key: 'waterBoilingPoint',
				label: 'Plain water would boil at',
				...showTemperature(v.waterBoilingPoint, unit)
			});
		}
		rows.push(
			{
				key: 'capRange',
				label: 'If the cap opens within ±10 % of its rating',
				text: `${low.text} to ${high.text}`,
				also: `${low.also} to ${high.also}`
			},
			{
				key: 'capGauge',
				label: 'Cap pressure (gauge)',
				text: show(v.capGauge),
				also:
					capUnit === 'kPa'
						? undefined
						: `${formatNumber(convertPressure(v.capGauge.value, 'kPa', capUnit), 2)} ${capUnit}`
			},
			{
				key: 'atmosphericPressure',
				label: 'Air pressure at this altitude',
				text: show(v.atmosphericPressure)
			},
			{
				key: 'absolutePressure',
				label: 'Absolute pressure in the system',
				text: show(v.absolutePressure)
			}
		);
		if (v.glycolMassPercent) {
			rows.push({
				key: 'glycolMassPercent',
				label: 'Glycol by mass',
				text: show(v.glycolMassPercent, 1)
			});
		}
		if (v.waterMoleFraction) {
			rows.push({
				key: 'waterMoleFraction',
				label: 'Water mole fraction',
				text: show(v.waterMoleFraction, 4)
			});
		}
		return { rows };
	}
};

export const serviceIntervalFields = [
	'lastChangeKind',
	'lastChangeDate',
	'lastChangeOdometerKm',
	'inServiceDate',
	'currentDate',
	'currentOdometerKm',
	'averageKmPerDay',
	'firstChangeKm',
	'thenEveryKm',
	'everyMonths',
	'dueSoonDays',
	'dueSoonKm'
] as const;

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

export const serviceIntervalForm: CalculatorForm = {
	calculator: 'service-interval',
	fields: serviceIntervalFields,
	fieldOf: {
		lastChange: 'lastChangeKind',
		'lastChange.kind': 'lastChangeKind',
		'lastChange.date': 'lastChangeDate',
		'lastChange.odometerKm': 'lastChangeOdometerKm',
		'lastChange.inServiceDate': 'inServiceDate',
		currentDate: 'currentDate',
		currentOdometerKm: 'currentOdometerKm',
		averageKmPerDay: 'averageKmPerDay',
		'settings.firstChangeKm': 'firstChangeKm',
		'settings.thenEveryKm': 'thenEveryKm',
		'settings.everyMonths': 'everyMonths',
		'settings.dueSoonDays': 'dueSoonDays',
		'settings.dueSoonKm': 'dueSoonKm'
	},
	toInput(values) {
		const errors: FieldErrors = {};
		const kind = readChoice(values, 'lastChangeKind', ['changed', 'never'], errors);
		// A setting left empty falls back to the shop's own (filled in by the server module).
		const settings = Object.fromEntries(
			(['firstChangeKm', 'thenEveryKm', 'everyMonths', 'dueSoonDays', 'dueSoonKm'] as const)
				.map((field) => [field, readNumber(values, field)] as const)
				.filter(([, value]) => value !== undefined)
		);
		return {
			input: {
				lastChange:
					kind === 'changed'
						? {
								kind,
								date: values.lastChangeDate || undefined,
								odometerKm: readNumber(values, 'lastChangeOdometerKm')
							}
						: { kind, inServiceDate: values.inServiceDate || undefined },
				currentDate: values.currentDate || undefined,
				currentOdometerKm: readNumber(values, 'currentOdometerKm'),
				averageKmPerDay: readNumber(values, 'averageKmPerDay'),
				settings
			},
			errors
		};
	},
	present(result) {
		const v = result.values as ServiceIntervalValues;
		const rows: DisplayRow[] = [
			{ key: 'status', label: 'Status', text: statusLabels[v.status], tone: statusTones[v.status] },
			{ key: 'dueDate', label: 'Due by', text: v.dueDate, also: firstLimitLabels[v.firstLimit] },
			{ key: 'dueOdometer', label: 'Due at', text: show(v.dueOdometer, 0) },
			v.daysRemaining.value < 0
				? {
						key: 'daysRemaining',
						label: 'Past the due date by',
						text: show({ ...v.daysRemaining, value: -v.daysRemaining.value }, 0)
					}
				: { key: 'daysRemaining', label: 'Time left', text: show(v.daysRemaining, 0) },
			v.kmRemaining.value < 0
				? {
						key: 'kmRemaining',
						label: 'Past the distance limit by',
						text: show({ ...v.kmRemaining, value: -v.kmRemaining.value }, 0)
					}
				: { key: 'kmRemaining', label: 'Distance left', text: show(v.kmRemaining, 0) },
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
			rows.push({ key: 'averageDistance', label: 'Average use', text: show(v.averageDistance, 1) });
		}
		return { rows };
	}
};

export const unitConversionForm: CalculatorForm = {
	calculator: 'unit-conversion',
	fields: ['value', 'from', 'to'],
	fieldOf: { value: 'value', from: 'from', to: 'to' },
	toInput(values) {
		return {
			input: { value: readNumber(values, 'value'), from: values.from, to: values.to },
			errors: {}
		};
	},
	present(result) {
		const v = result.values as ConversionValues;
		return {
			rows: [
				{ key: 'output', label: 'Result', text: show(v.output, 12) },
				{ key: 'input', label: 'From', text: show(v.input, 12) }
			]
		};
	}
};

/** The unit list for the conversion form, grouped by what they measure. */
export const conversionUnitGroups = [
	{ label: 'Volume', units: volumeUnits },
	{ label: 'Pressure', units: pressureUnits },
	{ label: 'Torque', units: torqueUnits },
	{ label: 'Temperature', units: temperatureUnits }
];

/** Puts each issue at its field; issues with no field of their own go to the form's message. */
export function placeIssues(
	form: CalculatorForm,
	issues: { path: string; message: string }[]
): { errors: FieldErrors; unplaced: string[] } {
	const errors: FieldErrors = {};
	const unplaced: string[] = [];
	for (const issue of issues) {
		const field = form.fieldOf[issue.path];
		if (field) errors[field] ??= issue.message;
		else unplaced.push(issue.message);
	}
	return { errors, unplaced };
}

/** What the forms show before anyone has calculated: common figures a technician starts from. */
export function createFormDefaults(
	today: string,
	intervals: IntervalSettings
): Record<CalculatorName, FormValues> {
	return {
		'freeze-point': { glycol: 'EG', basis: 'volume', percent: '50', temperatureUnit: '°C' },
		'glycol-for-freeze-point': {
			glycol: 'EG',
			basis: 'volume',
			freezePoint: '-37',
			temperatureUnit: '°C'
		},
		'mix-adjustment': {
			glycol: 'EG',
			capacity: '10',
			volumeUnit: 'L',
			currentKnownAs: 'freezePoint',
			currentPercent: '',
			currentFreezePoint: '-20',
			targetFreezePoint: '-37',
			temperatureUnit: '°C',
			refillPercent: '100'
		},
		'drain-and-fill': {
			capacity: '10',
			drain: '4',
			volumeUnit: 'L',
			cycles: '3',
			targetFresh: ''
		},
		'boiling-point': {
			capValue: '15',
			capUnit: 'psi',
			altitude: '0',
			altitudeUnit: 'm',
			coolant: 'EG',
			glycolPercent: '50',
			glycolBasis: 'volume',
			temperatureUnit: '°C'
		},
		'service-interval': {
			lastChangeKind: 'changed',
			lastChangeDate: '',
			lastChangeOdometerKm: '',
			inServiceDate: '',
			currentDate: today,
			currentOdometerKm: '',
			averageKmPerDay: '',
			firstChangeKm: String(intervals.firstChangeKm),
			thenEveryKm: String(intervals.thenEveryKm),
			everyMonths: String(intervals.everyMonths),
			dueSoonDays: String(intervals.dueSoonDays),
			dueSoonKm: String(intervals.dueSoonKm)
		},
		'unit-conversion': { value: '15', from: 'psi', to: 'kPa' }
	};
}

export type FreezeCurve = {
	title: string;
	unit: 'wt %' | 'vol %';
	/** [percent, °C] every 1 %, for drawing. */
	curve: [number, number][];
	/** The printed points the curve passes through. */
	points: [number, number][];
};

/** Each freeze table as points to draw, from the same interpolation the calculator uses. */
export function describeFreezeCurves(): Record<FreezeTableId, FreezeCurve> {
	const entries = Object.values(freezeTables).map((table) => {
		const max = table.points[table.points.length - 1].percent;
		const curve: [number, number][] = [];
		for (let percent = 0; percent <= max; percent++) {
			curve.push([percent, interpolateFreezePointC(table, percent)]);
		}
		return [
			table.id,
			{
				title: table.title,
				unit: table.basis === 'mass' ? 'wt %' : 'vol %',
				curve,
				points: table.points.map((p) => [p.percent, p.freezePointC] as [number, number])
			}
		] as const;
	});
	return Object.fromEntries(entries) as Record<FreezeTableId, FreezeCurve>;
}
