// The freeze-point calculators' forms: a mix's freeze point, and the glycol a freeze point needs.
import {
	CAUTION_COOLANT_POISON,
	freezeTables,
	type CalculatorResult,
	type FreezePointValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import { show, showTemperature, temperatureChoices } from './display';
import { options, readFormNumber } from './fields';
import {
	basisOptions,
	glycolOptions,
	readConverted,
	temperatureUnitOf,
	toCelsius
} from './helpers';

/** The freeze point of a mix, and its reverse: the glycol a freeze point needs. */
const showIn = {
	kind: 'select',
	name: 'temperatureUnit',
	label: 'Show temperatures in',
	options: options(temperatureChoices)
} as const;

function tableRow(result: CalculatorResult) {
	const v = result.values as FreezePointValues;
	return { key: 'table', label: 'Table', text: freezeTables[v.table].title };
}

export const freezePointForm: CalculatorFormDefinition = {
	calculator: 'freeze-point',
	action: 'freezePoint',
	short: 'Freeze point',
	cautions: [CAUTION_COOLANT_POISON],
	fields: [
		{ kind: 'select', name: 'glycol', label: 'Glycol', options: glycolOptions },
		{ kind: 'select', name: 'basis', label: 'Concentration given', options: basisOptions },
		{
			kind: 'number',
			name: 'percent',
			label: 'Glycol concentration (%)',
			required: true,
			hint: 'A refractometer or the mixing record gives this; at most 60 %.'
		},
		showIn
	],
	defaults: () => ({ glycol: 'EG', basis: 'volume', percent: '50', temperatureUnit: '°C' }),
	fieldOf: { glycol: 'glycol', basis: 'basis', percent: 'percent' },
	toInput: (values) => ({
		input: { glycol: values.glycol, basis: values.basis, percent: readFormNumber(values.percent) },
		errors: {}
	}),
	present(result, values) {
		const v = result.values as FreezePointValues;
		return [
			{
				key: 'freezePoint',
				label: 'Freeze point',
				...showTemperature(v.freezePoint, temperatureUnitOf(values))
			},
			{ key: 'concentration', label: 'Glycol concentration', text: show(v.concentration) },
			tableRow(result),
			{
				key: 'interpolated',
				label: 'From the table',
				text: v.interpolated ? 'between two table points (interpolated)' : 'a printed table point'
			}
		];
	}
};

export const glycolForFreezePointForm: CalculatorFormDefinition = {
	calculator: 'glycol-for-freeze-point',
	action: 'glycolForFreezePoint',
	short: 'Glycol needed',
	cautions: [CAUTION_COOLANT_POISON],
	fields: [
		{ kind: 'select', name: 'glycol', label: 'Glycol', options: glycolOptions },
		{ kind: 'select', name: 'basis', label: 'Concentration wanted', options: basisOptions },
		{
			kind: 'number',
			name: 'freezePoint',
			label: 'Protect down to',
			required: true,
			signed: true,
			unit: { name: 'temperatureUnit', choices: temperatureChoices },
			hint: 'The lowest temperature the coolant must survive, with a margin.'
		}
	],
	defaults: () => ({ glycol: 'EG', basis: 'volume', freezePoint: '-37', temperatureUnit: '°C' }),
	fieldOf: { glycol: 'glycol', basis: 'basis', freezePointC: 'freezePoint' },
	toInput(values) {
		const errors = {};
		const freezePointC = readConverted(
			values,
			'freezePoint',
			errors,
			toCelsius(temperatureUnitOf(values))
		);
		return { input: { glycol: values.glycol, basis: values.basis, freezePointC }, errors };
	},
	present(result, values) {
		const v = result.values as FreezePointValues;
		return [
			{ key: 'concentration', label: 'Glycol needed', text: show(v.concentration) },
			{
				key: 'freezePoint',
				label: 'Protects down to',
				...showTemperature(v.freezePoint, temperatureUnitOf(values))
			},
			tableRow(result)
		];
	}
};
