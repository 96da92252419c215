// The mix-adjustment calculator's form: drain and replace to reach a target freeze point.
import {
	CAUTION_COOLANT_POISON,
	CAUTION_FOLLOW_PROCEDURE,
	CAUTION_HOT_CAP,
	type AdjustMixValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import {
	choiceOf,
	show,
	showTemperature,
	showVolume,
	temperatureChoices,
	volumeChoices,
	type DisplayRow
} from './display';
import { options, readFormNumber, type FieldErrors } from './fields';
import { glycolOptions, readConverted, temperatureUnitOf, toCelsius, toLitres } from './helpers';

/** How much to drain and replace to bring a mix to a target freeze point. */
const fluidLabels: Record<AdjustMixValues['addFluid'], string> = {
	concentrate: 'Then add concentrate',
	premix: 'Then add premixed coolant',
	water: 'Then add water',
	none: 'Then add'
};

export const mixAdjustmentForm: CalculatorFormDefinition = {
	calculator: 'mix-adjustment',
	action: 'mixAdjustment',
	short: 'Correct the mix',
	cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
	fields: [
		{ kind: 'select', name: 'glycol', label: 'Glycol', options: glycolOptions },
		{
			kind: 'number',
			name: 'capacity',
			label: 'System capacity',
			required: true,
			unit: { name: 'volumeUnit', choices: volumeChoices },
			hint: "The whole cooling system, from the vehicle's data; answers come in the same unit."
		},
		{
			kind: 'select',
			name: 'temperatureUnit',
			label: 'Temperatures in',
			options: options(temperatureChoices)
		},
		{
			kind: 'choice',
			name: 'currentKnownAs',
			label: 'The current mix is known as',
			options: [
				{ value: 'freezePoint', label: 'Measured freeze point' },
				{ value: 'percent', label: 'Concentration' }
			]
		},
		{
			kind: 'number',
			name: 'currentFreezePoint',
			label: 'Measured freeze point',
			signed: true,
			showWhen: { field: 'currentKnownAs', value: 'freezePoint' },
			hint: 'From a refractometer or hydrometer, in the unit chosen above.'
		},
		{
			kind: 'number',
			name: 'currentPercent',
			label: 'Current concentration (vol %)',
			showWhen: { field: 'currentKnownAs', value: 'percent' }
		},
		{
			kind: 'number',
			name: 'targetFreezePoint',
			label: 'Target freeze point',
			required: true,
			signed: true,
			hint: 'In the unit chosen above.'
		},
		{
			kind: 'number',
			name: 'refillPercent',
			label: 'Refill strength (% glycol)',
			hint: '100 % is concentrate, 50 % a premix. Used when the mix must get stronger.'
		}
	],
	defaults: () => ({
		glycol: 'EG',
		capacity: '10',
		volumeUnit: 'L',
		currentKnownAs: 'freezePoint',
		currentPercent: '',
		currentFreezePoint: '-20',
		targetFreezePoint: '-37',
		temperatureUnit: '°C',
		refillPercent: '100'
	}),
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
		const celsius = toCelsius(temperatureUnitOf(values));
		const litres = toLitres(choiceOf(values.volumeUnit, volumeChoices));
		// Only the way the person chose counts; the other field may still hold an old value.
		const current =
			values.currentKnownAs === 'percent'
				? { currentPercent: readFormNumber(values.currentPercent) }
				: { currentFreezePointC: readConverted(values, 'currentFreezePoint', errors, celsius) };
		return {
			input: {
				glycol: values.glycol,
				capacityL: readConverted(values, 'capacity', errors, litres),
				...current,
				targetFreezePointC: readConverted(values, 'targetFreezePoint', errors, celsius),
				refillPercent: readFormNumber(values.refillPercent)
			},
			errors
		};
	},
	present(result, values) {
		const v = result.values as AdjustMixValues;
		const volumeUnit = choiceOf(values.volumeUnit, volumeChoices);
		const temperatureUnit = temperatureUnitOf(values);
		const rows: DisplayRow[] = [
			{ key: 'drain', label: 'Drain', ...showVolume(v.drain, volumeUnit) },
			v.addFluid === 'none'
				? { key: 'add', label: fluidLabels.none, text: 'nothing: the mix is on target' }
				: { key: 'add', label: fluidLabels[v.addFluid], ...showVolume(v.add, volumeUnit) },
			{ key: 'currentConcentration', label: 'Current mix', text: show(v.currentConcentration) }
		];
		if (v.currentFreezePoint) {
			rows.push({
				key: 'currentFreezePoint',
				label: 'Current mix freezes at',
				...showTemperature(v.currentFreezePoint, temperatureUnit)
			});
		}
		rows.push(
			{ key: 'targetConcentration', label: 'Target mix', text: show(v.targetConcentration) },
			{
				key: 'targetFreezePoint',
				label: 'Target freezes at',
				...showTemperature(v.targetFreezePoint, temperatureUnit)
			}
		);
		return rows;
	}
};
