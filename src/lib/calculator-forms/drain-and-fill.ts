// The drain-and-fill calculator's form.
import {
	CAUTION_COOLANT_POISON,
	CAUTION_FOLLOW_PROCEDURE,
	CAUTION_HOT_CAP,
	type DrainFillValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import { choiceOf, show, showVolume, volumeChoices, type DisplayRow } from './display';
import { readFormNumber, type FieldErrors } from './fields';
import { readConverted, toLitres } from './helpers';

/** Share of fresh coolant after partial drains, and the cycles a target needs. */
export const drainAndFillForm: CalculatorFormDefinition = {
	calculator: 'drain-and-fill',
	action: 'drainAndFill',
	short: 'Drain-and-fill',
	cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
	fields: [
		{
			kind: 'number',
			name: 'capacity',
			label: 'System capacity',
			required: true,
			unit: { name: 'volumeUnit', choices: volumeChoices }
		},
		{
			kind: 'number',
			name: 'drain',
			label: 'Drained each cycle (same unit)',
			required: true,
			hint: 'Measure what actually comes out; the block and heater keep some.'
		},
		{ kind: 'number', name: 'cycles', label: 'Number of cycles', hint: 'From 1 to 100.' },
		{
			kind: 'number',
			name: 'targetFresh',
			label: 'Target share of fresh coolant (%, optional)',
			hint: 'Give one to see how many cycles reach it.'
		}
	],
	defaults: () => ({ capacity: '10', drain: '4', volumeUnit: 'L', cycles: '3', targetFresh: '' }),
	fieldOf: {
		capacityL: 'capacity',
		drainL: 'drain',
		cycles: 'cycles',
		targetFreshPercent: 'targetFresh'
	},
	toInput(values) {
		const errors: FieldErrors = {};
		const litres = toLitres(choiceOf(values.volumeUnit, volumeChoices));
		return {
			input: {
				capacityL: readConverted(values, 'capacity', errors, litres),
				drainL: readConverted(values, 'drain', errors, litres),
				cycles: readFormNumber(values.cycles),
				targetFreshPercent: readFormNumber(values.targetFresh)
			},
			errors
		};
	},
	present(result, values) {
		const v = result.values as DrainFillValues;
		const rows: DisplayRow[] = [
			{ key: 'renewedPerCycle', label: 'Renewed per cycle', text: show(v.renewedPerCycle) }
		];
		if (v.cycles && v.freshAfterCycles) {
			rows.push({
				key: 'freshAfterCycles',
				label: `Fresh coolant after ${v.cycles.value} cycle${v.cycles.value === 1 ? '' : 's'}`,
				text: show(v.freshAfterCycles)
			});
		}
		if (v.cyclesNeeded && v.freshAfterCyclesNeeded) {
			rows.push(
				{ key: 'cyclesNeeded', label: 'Cycles needed for the target', text: show(v.cyclesNeeded) },
				{
					key: 'freshAfterCyclesNeeded',
					label: 'Fresh coolant after those cycles',
					text: show(v.freshAfterCyclesNeeded)
				}
			);
		}
		if (v.coolantNeeded) {
			rows.push({
				key: 'coolantNeeded',
				label: 'Fresh coolant to have ready',
				...showVolume(v.coolantNeeded, choiceOf(values.volumeUnit, volumeChoices))
			});
		}
		return rows;
	}
};
