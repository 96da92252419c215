// Boiling point of water or a glycol mix under a pressure cap at an altitude (IAPWS-IF97).
import { CAUTION_COOLANT_POISON, CAUTION_HOT_CAP } from './cautions';
import { CalculatorError, throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber } from './format';
import type { ConcentrationBasis } from './freeze-point';
import { toQuantity, type CalculatorResult, type Quantity } from './result';
import { checkRange, inputRanges } from './ranges';
import { convertPressure, pascalsPerUnit, type PressureUnit } from './units';

/**
 * IAPWS-IF97 region 4: the saturation line of water (IAPWS R7-97(2012), eqs. 29–31). The
 * coefficients n1…n10 are the standard's own, written from memory and proved by the standard's
 * verification values in the tests.
 */
const N = [
	0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.1202082470247e5,
	-0.32325550322333e7, 0.1491510861353e2, -0.48232657361591e4, 0.40511340542057e6,
	-0.23855557567849, 0.65017534844798e3
] as const;
const [n1, n2, n3, n4, n5, n6, n7, n8, n9, n10] = N;

export const IF97_MIN_PRESSURE_MPA = 611.213e-6;
export const IF97_MAX_PRESSURE_MPA = 22.064;
export const IF97_MIN_TEMPERATURE_K = 273.15;
export const IF97_MAX_TEMPERATURE_K = 647.096;

/** Saturation pressure of water (MPa) at a temperature (K), IF97 eq. 30. */
export function findSaturationPressureMPa(temperatureK: number): number {
	if (!(temperatureK >= IF97_MIN_TEMPERATURE_K && temperatureK <= IF97_MAX_TEMPERATURE_K)) {
		throw new CalculatorError(
			`${formatNumber(temperatureK, 3)} K is outside the IAPWS-IF97 saturation range (273.15 K to 647.096 K).`,
			'temperatureK'
		);
	}
	const theta = temperatureK + n9 / (temperatureK - n10);
	const a = theta * theta + n1 * theta + n2;
	const b = n3 * theta * theta + n4 * theta + n5;
	const c = n6 * theta * theta + n7 * theta + n8;
	return ((2 * c) / (-b + Math.sqrt(b * b - 4 * a * c))) ** 4;
}

/** Saturation temperature of water (K) at a pressure (MPa), IF97 eq. 31. */
export function findSaturationTemperatureK(pressureMPa: number): number {
	if (!(pressureMPa >= IF97_MIN_PRESSURE_MPA && pressureMPa <= IF97_MAX_PRESSURE_MPA)) {
		throw new CalculatorError(
			`${formatNumber(pressureMPa * 1000, 3)} kPa is outside the IAPWS-IF97 saturation range (611.213 Pa to 22.064 MPa).`,
			'pressure'
		);
	}
	const beta = pressureMPa ** 0.25;
	const e = beta * beta + n3 * beta + n6;
	const f = n1 * beta * beta + n4 * beta + n7;
	const g = n2 * beta * beta + n5 * beta + n8;
	const d = (2 * g) / (-f - Math.sqrt(f * f - 4 * e * g));
	return (n10 + d - Math.sqrt((n10 + d) ** 2 - 4 * (n9 + n10 * d))) / 2;
}

/**
 * US Standard Atmosphere 1976 (the same as the ICAO standard atmosphere below 11 km),
 * troposphere layer: p = p0 (1 − L h / T0)^(g0 M / (R* L)), with the standard's constants.
 * The altitude is taken as geopotential; the difference from height above sea level is
 * under 0.1 % at road altitudes.
 */
const SEA_LEVEL_PRESSURE_PA = 101_325;
const SEA_LEVEL_TEMPERATURE_K = 288.15;
const LAPSE_RATE_K_PER_M = 0.0065;
const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
const AIR_MOLAR_MASS_KG_PER_MOL = 0.0289644;
const GAS_CONSTANT_1976_J_PER_MOL_K = 8.31432;
export const MIN_ALTITUDE_M = inputRanges.altitudeM.min;
export const MAX_ALTITUDE_M = inputRanges.altitudeM.max;

export function findStandardAtmospherePressureKPa(altitudeM: number): number {
	if (!(altitudeM >= MIN_ALTITUDE_M && altitudeM <= MAX_ALTITUDE_M)) {
		throw new CalculatorError(
			`Altitude must be between ${formatNumber(MIN_ALTITUDE_M)} and ${formatNumber(MAX_ALTITUDE_M)} m (the standard atmosphere's lowest layer).`,
			'altitudeM'
		);
	}
	const exponent =
		(STANDARD_GRAVITY_M_PER_S2 * AIR_MOLAR_MASS_KG_PER_MOL) /
		(GAS_CONSTANT_1976_J_PER_MOL_K * LAPSE_RATE_K_PER_M);
	const ratio = 1 - (LAPSE_RATE_K_PER_M * altitudeM) / SEA_LEVEL_TEMPERATURE_K;
	return (SEA_LEVEL_PRESSURE_PA * ratio ** exponent) / 1000;
}

/**
 * Mix properties for the Raoult's-law estimate. From memory: molar masses from the atomic
 * weights; densities at 20 °C (water 0.9982 g/mL, ethylene glycol 1.1135 g/mL), used only to
 * turn a volume % of concentrate into a mass %, treating the concentrate as pure glycol.
 */
export const WATER_MOLAR_MASS_G_PER_MOL = 18.015;
export const ETHYLENE_GLYCOL_MOLAR_MASS_G_PER_MOL = 62.068;
export const WATER_DENSITY_G_PER_ML = 0.9982;
export const ETHYLENE_GLYCOL_DENSITY_G_PER_ML = 1.1135;

/** The highest glycol share the boiling estimate has been checked against. */
export const MAX_BOILING_GLYCOL_PERCENT = 60;

/** Mass % of ethylene glycol in a mix made from the given volume % of glycol and water. */
export function convertGlycolVolumeToMassPercent(volumePercent: number): number {
	const glycolG = volumePercent * ETHYLENE_GLYCOL_DENSITY_G_PER_ML;
	const waterG = (100 - volumePercent) * WATER_DENSITY_G_PER_ML;
	return (100 * glycolG) / (glycolG + waterG);
}

/** Mole fraction of water in an ethylene glycol–water mix. */
export function findWaterMoleFraction(percent: number, basis: ConcentrationBasis): number {
	const massPercent = basis === 'mass' ? percent : convertGlycolVolumeToMassPercent(percent);
	const waterMol = (100 - massPercent) / WATER_MOLAR_MASS_G_PER_MOL;
	const glycolMol = massPercent / ETHYLENE_GLYCOL_MOLAR_MASS_G_PER_MOL;
	return waterMol / (waterMol + glycolMol);
}

/**
 * Boiling point (°C) of a mix at an absolute pressure. Raoult's law with the glycol's own
 * vapour pressure neglected (it is about 1 % of water's at these temperatures): the mix boils
 * where x_water × Ps(T) equals the pressure, so T = Ts(p / x_water). Region 4 is explicit in
 * both directions, so the inversion of Ps needs no iteration.
 */
export function findBoilingPointC(absolutePressureKPa: number, waterMoleFraction = 1): number {
	if (!(waterMoleFraction > 0 && waterMoleFraction <= 1)) {
		throw new CalculatorError('The water mole fraction must be above 0 and at most 1.', 'glycol');
	}
	return findSaturationTemperatureK(absolutePressureKPa / waterMoleFraction / 1000) - 273.15;
}

export interface BoilingPointInput {
	capGauge: { value: number; unit: PressureUnit };
	altitudeM?: number;
	glycol?: { type: 'EG'; percent: number; basis: ConcentrationBasis };
}

export type BoilingPointValues = {
	boilingPoint: Quantity<'°C'>;
	waterBoilingPoint: Quantity<'°C'>;
	boilingPointIfCapOpensLow: Quantity<'°C'>;
	boilingPointIfCapOpensHigh: Quantity<'°C'>;
	capGauge: Quantity<'kPa'>;
	atmosphericPressure: Quantity<'kPa'>;
	absolutePressure: Quantity<'kPa'>;
	glycolMassPercent: Quantity<'wt %'> | null;
	waterMoleFraction: Quantity<'mol/mol'> | null;
};

/** Pressure caps are built to open at 3–16 psi; anything far above is a wrong unit, not a cap. */
export const MAX_CAP_GAUGE_KPA = inputRanges.capGaugeKPa.max;
/** A cap should open within about 10 % of its stamped rating (a heavy-truck maintenance manual). */
export const CAP_TOLERANCE_FRACTION = 0.1;

export function checkBoilingPointInput(input: BoilingPointInput): CalculatorIssue[] {
	const issues: CalculatorIssue[] = [];
	const { value, unit } = input.capGauge;
	if (!Number.isFinite(value)) {
		issues.push({ path: 'capGauge.value', message: 'Cap pressure must be a number.' });
	} else if (value < 0) {
		issues.push({
			path: 'capGauge.value',
			message: 'Cap pressure is a gauge pressure above the outside air and cannot be negative.'
		});
	} else if (!((value * pascalsPerUnit[unit]) / 1000 <= MAX_CAP_GAUGE_KPA)) {
		issues.push({
			path: 'capGauge.value',
			message: `${formatNumber(value, 2)} ${unit} is far above any coolant cap (at most ${MAX_CAP_GAUGE_KPA} kPa, ${formatNumber(convertPressure(MAX_CAP_GAUGE_KPA, 'kPa', 'psi'), 1)} psi): check the unit.`
		});
	}
	if (input.altitudeM !== undefined) {
		issues.push(...checkRange(input.altitudeM, inputRanges.altitudeM, 'altitudeM'));
	}
	if (input.glycol) {
		const { percent } = input.glycol;
		const rangeIssues = checkRange(percent, inputRanges.glycolPercent, 'glycol.percent');
		issues.push(...rangeIssues);
		if (rangeIssues.length === 0 && percent > MAX_BOILING_GLYCOL_PERCENT) {
			issues.push({
				path: 'glycol.percent',
				message: `The boiling estimate is checked only up to ${MAX_BOILING_GLYCOL_PERCENT} % glycol. Above about ${MAX_BOILING_GLYCOL_PERCENT} % the freeze protection gets worse, not better: do not exceed ${MAX_BOILING_GLYCOL_PERCENT} %.`
			});
		}
	}
	return issues;
}

function describeMixSteps(
	glycol: NonNullable<BoilingPointInput['glycol']>,
	massPercent: number,
	waterFraction: number,
	absoluteKPa: number
): string[] {
	const steps: string[] = [];
	if (glycol.basis === 'volume') {
		steps.push(
			`${formatNumber(glycol.percent, 1)} % by volume is ${formatNumber(massPercent, 1)} % by mass (densities at 20 °C: glycol ${ETHYLENE_GLYCOL_DENSITY_G_PER_ML} g/mL, water ${WATER_DENSITY_G_PER_ML} g/mL).`
		);
	}
	steps.push(
		`Water mole fraction: ${formatNumber(waterFraction, 4)}. The mix boils where ${formatNumber(waterFraction, 4)} × Ps(T) = ${formatNumber(absoluteKPa, 2)} kPa, i.e. where water alone would at ${formatNumber(absoluteKPa / waterFraction, 2)} kPa.`
	);
	return steps;
}

function describeBoilingBasis(withGlycol: boolean): string {
	return [
		'Water: IAPWS-IF97 region 4 saturation equation (IAPWS R7-97(2012)).',
		'Outside air: US Standard Atmosphere 1976 (ICAO standard atmosphere) barometric formula, troposphere layer.',
		withGlycol
			? "Ethylene glycol mix: Raoult's law on the water mole fraction, glycol vapour pressure neglected."
			: ''
	]
		.filter(Boolean)
		.join(' ');
}

function findGlycolMassPercent(glycol: NonNullable<BoilingPointInput['glycol']>): number {
	return glycol.basis === 'mass'
		? glycol.percent
		: convertGlycolVolumeToMassPercent(glycol.percent);
}

/** Boiling points with the cap opening at the low and the high end of its tolerance. */
function findCapToleranceRangeC(
	atmosphericKPa: number,
	capGaugeKPa: number,
	waterFraction: number
) {
	return {
		lowC: findBoilingPointC(
			atmosphericKPa + capGaugeKPa * (1 - CAP_TOLERANCE_FRACTION),
			waterFraction
		),
		highC: findBoilingPointC(
			atmosphericKPa + capGaugeKPa * (1 + CAP_TOLERANCE_FRACTION),
			waterFraction
		)
	};
}

/** From 1000 m up: how much lower the coolant boils than at sea level with the same cap. */
function warnAboutAltitude(
	altitudeM: number,
	capGaugeKPa: number,
	waterFraction: number,
	boilingC: number
): string[] {
	if (altitudeM < 1000) return [];
	return [
		`At ${formatNumber(altitudeM, 0)} m the air pressure is lower, so the coolant boils about ${formatNumber(findBoilingPointC(101.325 + capGaugeKPa, waterFraction) - boilingC, 1)} °C lower than at sea level with the same cap.`
	];
}

/**
 * Boiling point of the coolant while the cap holds: absolute pressure = standard-atmosphere
 * pressure at the altitude + the cap's gauge pressure; water from IF97, an ethylene glycol mix
 * from Raoult's law on the water mole fraction.
 */
export function boilingPointUnderCap(
	input: BoilingPointInput
): CalculatorResult<BoilingPointValues> {
	throwIfIssues(checkBoilingPointInput(input));
	const altitudeM = input.altitudeM ?? 0;
	const capGaugeKPa = convertPressure(input.capGauge.value, input.capGauge.unit, 'kPa');
	const atmosphericKPa = findStandardAtmospherePressureKPa(altitudeM);
	const absoluteKPa = atmosphericKPa + capGaugeKPa;
	const glycol = input.glycol;
	const massPercent = glycol ? findGlycolMassPercent(glycol) : null;
	const waterFraction = glycol ? findWaterMoleFraction(glycol.percent, glycol.basis) : 1;
	const boilingC = findBoilingPointC(absoluteKPa, waterFraction);
	const waterBoilingC = findBoilingPointC(absoluteKPa);
	const { lowC, highC } = findCapToleranceRangeC(atmosphericKPa, capGaugeKPa, waterFraction);
	const openCapC = findBoilingPointC(atmosphericKPa, waterFraction);
	// Rounded to what the method supports: IF97 is good to 0.01 °C for water, the glycol
	// estimate to about ±1.5 °C, so a mix is given in whole degrees.
	const boilDecimals = glycol ? 0 : 2;
	const rangeDecimals = glycol ? 0 : 1;

	const steps = [
		`Outside air at ${formatNumber(altitudeM, 0)} m (US Standard Atmosphere 1976 / ICAO): ${formatNumber(atmosphericKPa, 2)} kPa.`,
		`Cap ${formatNumber(input.capGauge.value, 2)} ${input.capGauge.unit} = ${formatNumber(capGaugeKPa, 2)} kPa gauge, so the system boils at ${formatNumber(atmosphericKPa, 2)} + ${formatNumber(capGaugeKPa, 2)} = ${formatNumber(absoluteKPa, 2)} kPa absolute.`
	];
	if (glycol && massPercent !== null) {
		steps.push(...describeMixSteps(glycol, massPercent, waterFraction, absoluteKPa));
	}
	steps.push(
		`Boiling point: ${formatNumber(boilingC, boilDecimals)} °C (water alone: ${formatNumber(waterBoilingC, 2)} °C).`,
		`With the cap open (or a cap that no longer holds) the boiling point falls to ${formatNumber(openCapC, rangeDecimals)} °C.`
	);

	const warnings = warnAboutAltitude(altitudeM, capGaugeKPa, waterFraction, boilingC);

	const basis = describeBoilingBasis(glycol !== undefined);

	return {
		values: {
			boilingPoint: toQuantity(boilingC, '°C', boilDecimals),
			waterBoilingPoint: toQuantity(waterBoilingC, '°C', 2),
			boilingPointIfCapOpensLow: toQuantity(lowC, '°C', rangeDecimals),
			boilingPointIfCapOpensHigh: toQuantity(highC, '°C', rangeDecimals),
			capGauge: toQuantity(capGaugeKPa, 'kPa', 2),
			atmosphericPressure: toQuantity(atmosphericKPa, 'kPa', 2),
			absolutePressure: toQuantity(absoluteKPa, 'kPa', 2),
			glycolMassPercent: massPercent === null ? null : toQuantity(massPercent, 'wt %', 1),
			waterMoleFraction: glycol ? toQuantity(waterFraction, 'mol/mol', 4) : null
		},
		basis,
		accuracy: `${glycol ? 'Glycol mix: an estimate good to about ±1.5 °C against published boiling points. ' : 'Water: within about 0.01 °C of the steam tables at this pressure. '}A cap opens within about ±10 % of its rating, which puts the real boiling point between ${formatNumber(lowC, rangeDecimals)} and ${formatNumber(highC, rangeDecimals)} °C; a weather front moves the air pressure by a few kPa more.`,
		warnings,
		cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON],
		steps
	};
}
