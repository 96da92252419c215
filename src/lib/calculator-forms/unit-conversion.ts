// The unit-conversion calculator's form.
import {
	countSignificantDigits,
	formatSignificant,
	pressureUnits,
	temperatureUnits,
	torqueUnits,
	volumeUnits,
	type ConversionValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import { readFormNumber, type Option } from './fields';

/** One value from one unit to another; the answer keeps the digits the person gave. */
const unitOptions: Option[] = [
	...volumeUnits.map((unit) => ({ value: unit, label: unit, group: 'Volume' })),
	...pressureUnits.map((unit) => ({ value: unit, label: unit, group: 'Pressure' })),
	...torqueUnits.map((unit) => ({ value: unit, label: unit, group: 'Torque' })),
	...temperatureUnits.map((unit) => ({ value: unit, label: unit, group: 'Temperature' }))
];

export const unitConversionForm: CalculatorFormDefinition = {
	calculator: 'unit-conversion',
	action: 'unitConversion',
	short: 'Units',
	cautions: [],
	fields: [
		{ kind: 'number', name: 'value', label: 'Value', required: true, signed: true },
		{
			kind: 'group',
			name: 'units',
			columns: 2,
			fields: [
				{ kind: 'select', name: 'from', label: 'From', options: unitOptions },
				{ kind: 'select', name: 'to', label: 'To', options: unitOptions }
			]
		}
	],
	defaults: () => ({ value: '15', from: 'psi', to: 'kPa' }),
	fieldOf: { value: 'value', from: 'from', to: 'to' },
	toInput: (values) => ({
		input: { value: readFormNumber(values.value), from: values.from, to: values.to },
		errors: {}
	}),
	present(result, values) {
		const v = result.values as ConversionValues;
		const digits = countSignificantDigits(values.value ?? '');
		return [
			{
				key: 'output',
				label: 'Result',
				text: `${formatSignificant(v.output.value, digits)} ${v.output.unit}`,
				also: `to ${Math.min(12, Math.max(4, digits))} significant digits, as many as the value given (at least 4)`
			},
			{
				key: 'input',
				label: 'From',
				text: `${formatSignificant(v.input.value, 12)} ${v.input.unit}`
			}
		];
	}
};
