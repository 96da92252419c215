// The boiling-point calculator's form.
import {
	CAUTION_COOLANT_POISON,
	CAUTION_HOT_CAP,
	convertPressure,
	formatNumber,
	type BoilingPointValues
} from '../calculators';
import type { CalculatorFormDefinition } from './definition';
import {
	altitudeChoices,
	choiceOf,
	pressureChoices,
	show,
	showTemperature,
	temperatureChoices,
	type DisplayRow
} from './display';
import { options, readFormNumber } from './fields';
import { basisOptions, temperatureUnitOf } from './helpers';

/** The boiling point under a pressure cap, at an altitude, for water or a glycol mix. */
const METRES_PER_FOOT = 0.3048; // exact (NIST SP 811, Appendix B)

function readAltitudeM(text: string | undefined, unit: string | undefined): number | undefined {
	const altitude = readFormNumber(text);
	return altitude === undefined || unit !== 'ft' ? altitude : altitude * METRES_PER_FOOT;
}

/** The cap's gauge pressure (also in the unit it was given in), the air's and their sum. */
function pressureRows(v: BoilingPointValues, capUnitText: string | undefined): DisplayRow[] {
	const capUnit = choiceOf(capUnitText, pressureChoices);
	return [
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
	];
}

/** For a glycol mix: its strength by mass and the water mole fraction the estimate used. */
function mixRows(v: BoilingPointValues): DisplayRow[] {
	const rows: DisplayRow[] = [];
	if (v.glycolMassPercent) {
		rows.push({
			key: 'glycolMassPercent',
			label: 'Glycol by mass',
			text: show(v.glycolMassPercent)
		});
	}
	if (v.waterMoleFraction) {
		rows.push({
			key: 'waterMoleFraction',
			label: 'Water mole fraction',
			text: show(v.waterMoleFraction, 4)
		});
	}
	return rows;
}

export const boilingPointForm: CalculatorFormDefinition = {
	calculator: 'boiling-point',
	action: 'boilingPoint',
	short: 'Boiling point',
	cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON],
	fields: [
		{
			kind: 'number',
			name: 'capValue',
			label: 'Cap pressure',
			required: true,
			unit: { name: 'capUnit', choices: pressureChoices },
			hint: 'The rating stamped on the cap (gauge pressure).'
		},
		{
			kind: 'number',
			name: 'altitude',
			label: 'Altitude',
			signed: true,
			unit: { name: 'altitudeUnit', choices: altitudeChoices },
			hint: 'Above sea level; leave 0 for the coast.'
		},
		{
			kind: 'choice',
			name: 'coolant',
			label: 'Coolant',
			options: [
				{ value: 'EG', label: 'Ethylene glycol mix' },
				{ value: 'water', label: 'Water only' }
			]
		},
		{
			kind: 'group',
			name: 'glycolMix',
			columns: 1,
			showWhen: { field: 'coolant', value: 'EG' },
			fields: [
				{ kind: 'number', name: 'glycolPercent', label: 'Glycol concentration (%)' },
				{ kind: 'select', name: 'glycolBasis', label: 'Concentration given', options: basisOptions }
			]
		},
		{
			kind: 'select',
			name: 'temperatureUnit',
			label: 'Show temperatures in',
			options: options(temperatureChoices)
		}
	],
	defaults: () => ({
		capValue: '15',
		capUnit: 'psi',
		altitude: '0',
		altitudeUnit: 'm',
		coolant: 'EG',
		glycolPercent: '50',
		glycolBasis: 'volume',
		temperatureUnit: '°C'
	}),
	fieldOf: {
		'capGauge.value': 'capValue',
		'capGauge.unit': 'capUnit',
		altitudeM: 'altitude',
		'glycol.type': 'coolant',
		'glycol.percent': 'glycolPercent',
		'glycol.basis': 'glycolBasis'
	},
	toInput(values) {
		const glycol =
			values.coolant === 'EG'
				? { type: 'EG', percent: readFormNumber(values.glycolPercent), basis: values.glycolBasis }
				: undefined;
		return {
			input: {
				capGauge: { value: readFormNumber(values.capValue), unit: values.capUnit },
				altitudeM: readAltitudeM(values.altitude, values.altitudeUnit),
				glycol
			},
			errors: {}
		};
	},
	present(result, values) {
		const v = result.values as BoilingPointValues;
		const unit = temperatureUnitOf(values);
		const low = showTemperature(v.boilingPointIfCapOpensLow, unit);
		const high = showTemperature(v.boilingPointIfCapOpensHigh, unit);
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
			...pressureRows(v, values.capUnit),
			...mixRows(v)
		);
		return rows;
	}
};
