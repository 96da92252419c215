// Freeze point of a glycol mix from published tables, its reverse, and how to adjust a mix.
import { CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE, CAUTION_HOT_CAP } from './cautions';
import { CalculatorError, throwIfIssues, type CalculatorIssue } from './errors';
import { formatNumber, roundTo } from './format';
import { createMonotoneCubic, type MonotoneCubic } from './pchip';
import { checkRange, inputRanges } from './ranges';
import {
	toQuantity,
	type CalculatorResult,
	type ChartPoint,
	type Quantity,
	type ResultChart
} from './result';

export type GlycolType = 'EG' | 'PG';
export type ConcentrationBasis = 'mass' | 'volume';
export type ConcentrationUnit = 'wt %' | 'vol %';
export type FreezeTableId = 'eg-mass' | 'eg-volume' | 'pg-volume';

export interface FreezeTablePoint {
	percent: number;
	freezePointC: number;
	source: string;
}

export interface FreezeTable {
	id: FreezeTableId;
	glycol: GlycolType;
	basis: ConcentrationBasis;
	title: string;
	/** The published sources of the points, for the result's basis line. */
	source: string;
	points: readonly FreezeTablePoint[];
	/**
	 * Decimals a result is given to: the source's printed precision, or one decimal where the
	 * source prints whole degrees, so that answers between points still move smoothly.
	 */
	freezePointDecimals: number;
}

/** More glycol than about this protects less, not more (US Army TM 5-6115-400-12). */
export const GLYCOL_LIMIT_PERCENT = 60;
/** From here on the result carries the 60 % warning. */
export const GLYCOL_WARNING_PERCENT = 55;

const WATER_SOURCE = 'pure water: ice point 0 °C';

const CRC =
	'CRC Handbook of Chemistry and Physics, 102nd ed. (2021), Concentrative Properties of Aqueous Solutions: ethylene glycol';
const TOOLBOX = 'Engineering ToolBox, Ethylene Glycol Heat-Transfer Fluid';
const ARMY_TM = 'US Army TM 5-3895-382-24';
// Cited by document number only: the product names no makers or brands.
const OPERATOR_MANUAL = 'an equipment operator’s manual, OMSU31337, coolant section';
const LANGE = "Lange's Handbook of Chemistry, Table 5.13";

function makePoints(
	source: string,
	pairs: readonly (readonly [number, number])[]
): FreezeTablePoint[] {
	return pairs.map(([percent, freezePointC]) => ({ percent, freezePointC, source }));
}

export const freezeTables: Record<FreezeTableId, FreezeTable> = {
	'eg-mass': {
		id: 'eg-mass',
		glycol: 'EG',
		basis: 'mass',
		title: 'pure ethylene glycol in water, % by mass',
		source: CRC,
		freezePointDecimals: 2,
		points: [
			{ percent: 0, freezePointC: 0, source: WATER_SOURCE },
			...makePoints(CRC, [
				[10, -3.37],
				[20, -7.93],
				[28, -13.03],
				[32, -16.23],
				[36, -19.82],
				[40, -23.84],
				[44, -28.32],
				[48, -33.3],
				[52, -38.81],
				[56, -44.83],
				[60, -51.23]
			])
		]
	},
	// Commercial antifreeze carries additives, so it freezes a little differently from pure EG.
	// Where service publications give a point it is used; the reference table fills 10 and 20 %.
	'eg-volume': {
		id: 'eg-volume',
		glycol: 'EG',
		basis: 'volume',
		title: 'commercial ethylene glycol antifreeze in water, % by volume',
		source: `${ARMY_TM} (30 %, 50 %); ${OPERATOR_MANUAL} (40 %, 50 %, 60 %); ${TOOLBOX} (10 %, 20 %)`,
		freezePointDecimals: 1,
		points: [
			{ percent: 0, freezePointC: 0, source: WATER_SOURCE },
			...makePoints(TOOLBOX, [
				[10, -3],
				[20, -8]
			]),
			{ percent: 30, freezePointC: -15, source: ARMY_TM },
			{ percent: 40, freezePointC: -24, source: OPERATOR_MANUAL },
			{ percent: 50, freezePointC: -37, source: `${ARMY_TM}; ${OPERATOR_MANUAL}` },
			{ percent: 60, freezePointC: -52, source: OPERATOR_MANUAL }
		]
	},
	'pg-volume': {
		id: 'pg-volume',
		glycol: 'PG',
		basis: 'volume',
		title: 'propylene glycol in water, % by volume',
		source: LANGE,
		freezePointDecimals: 1,
		points: [
			{ percent: 0, freezePointC: 0, source: WATER_SOURCE },
			...makePoints(LANGE, [
				[10, -2.2],
				[20, -6.7],
				[30, -12.8],
				[40, -20.6],
				[50, -33.3]
			])
		]
	}
};

const curves = new Map<FreezeTableId, MonotoneCubic>();

function findCurve(table: FreezeTable): MonotoneCubic {
	let curve = curves.get(table.id);
	if (!curve) {
		curve = createMonotoneCubic(
			table.points.map((p) => p.percent),
			table.points.map((p) => p.freezePointC)
		);
		curves.set(table.id, curve);
	}
	return curve;
}

const glycolNames: Record<GlycolType, string> = {
	EG: 'ethylene glycol',
	PG: 'propylene glycol'
};

export function concentrationUnit(basis: ConcentrationBasis): ConcentrationUnit {
	return basis === 'mass' ? 'wt %' : 'vol %';
}

function describeMix(table: FreezeTable, percent: number): string {
	return `${formatNumber(percent, 1)} % ${glycolNames[table.glycol]} by ${table.basis}`;
}

function tableMinPercent(table: FreezeTable): number {
	return table.points[0].percent;
}

function tableMaxPercent(table: FreezeTable): number {
	return table.points[table.points.length - 1].percent;
}

function lowestFreezePointC(table: FreezeTable): number {
	return table.points[table.points.length - 1].freezePointC;
}

/** The table for a glycol and basis; there is no published PG table by mass on file. */
export function findFreezeTable(
	glycol: GlycolType,
	basis: ConcentrationBasis,
	path = 'basis'
): FreezeTable {
	if (glycol === 'EG')
		return basis === 'mass' ? freezeTables['eg-mass'] : freezeTables['eg-volume'];
	if (basis === 'volume') return freezeTables['pg-volume'];
	throw new CalculatorError(
		'There is no propylene glycol freeze-point table by mass on file: give the concentration by volume.',
		path
	);
}

/** Why a concentration has no freeze point in this table, or an empty list when it has one. */
export function checkConcentration(
	table: FreezeTable,
	percent: number,
	path = 'percent'
): CalculatorIssue[] {
	if (!Number.isFinite(percent)) return [{ path, message: 'Concentration must be a number.' }];
	if (percent < 0 || percent > 100) {
		return [{ path, message: 'Glycol concentration must be between 0 and 100 %.' }];
	}
	const max = tableMaxPercent(table);
	if (percent > max) {
		const worse =
			percent > GLYCOL_LIMIT_PERCENT
				? ` Above about ${GLYCOL_LIMIT_PERCENT} % glycol the freeze protection gets worse, not better: do not exceed ${GLYCOL_LIMIT_PERCENT} %.`
				: '';
		return [
			{
				path,
				message: `No freeze point for ${describeMix(table, percent)}: the table covers ${tableMinPercent(table)}–${max} %.${worse}`
			}
		];
	}
	return [];
}

/** Why a freeze point cannot be reached with this table, or an empty list when it can. */
export function checkFreezePoint(
	table: FreezeTable,
	freezePointC: number,
	path = 'freezePointC'
): CalculatorIssue[] {
	if (!Number.isFinite(freezePointC)) return [{ path, message: 'Freeze point must be a number.' }];
	if (freezePointC > 0 && freezePointC <= inputRanges.freezePointC.max) {
		return [
			{ path, message: 'A freeze point above 0 °C is not possible: water alone freezes at 0 °C.' }
		];
	}
	const physical = checkRange(freezePointC, inputRanges.freezePointC, path);
	if (physical.length > 0) return physical;
	const lowest = lowestFreezePointC(table);
	if (freezePointC < lowest) {
		const max = tableMaxPercent(table);
		const worse =
			max >= GLYCOL_LIMIT_PERCENT
				? ` More glycol than about ${GLYCOL_LIMIT_PERCENT} % protects less, not more.`
				: '';
		return [
			{
				path,
				message: `No mix in the table (${table.title}) freezes as low as ${formatNumber(freezePointC, 2)} °C: its strongest mix, ${max} %, freezes at ${formatNumber(lowest, 2)} °C.${worse}`
			}
		];
	}
	return [];
}

/** Freeze point (°C) of a mix, interpolated in the table; never extrapolated. */
export function interpolateFreezePointC(table: FreezeTable, percent: number): number {
	throwIfIssues(checkConcentration(table, percent));
	return findCurve(table).evaluate(percent);
}

/** Concentration (% on the table's basis) whose freeze point is the one given. */
export function interpolateGlycolPercent(table: FreezeTable, freezePointC: number): number {
	throwIfIssues(checkFreezePoint(table, freezePointC));
	return findCurve(table).invert(freezePointC);
}

/** Says whether a concentration is a printed table point or lies between two of them. */
export function locateInTable(
	table: FreezeTable,
	percent: number
): { interpolated: boolean; description: string } {
	const exact = table.points.find((p) => Math.abs(p.percent - percent) < 1e-9);
	if (exact) {
		return {
			interpolated: false,
			description: `${exact.percent} % is a table point: ${formatNumber(exact.freezePointC, 2)} °C (${exact.source}).`
		};
	}
	const upper = table.points.findIndex((p) => p.percent > percent);
	const a = table.points[upper - 1];
	const b = table.points[upper];
	return {
		interpolated: true,
		description: `Interpolated (monotone cubic, PCHIP) between the table points ${a.percent} % (${formatNumber(a.freezePointC, 2)} °C) and ${b.percent} % (${formatNumber(b.freezePointC, 2)} °C).`
	};
}

/**
 * The table's freeze-point curve every 1 % (the same interpolation the answer uses), its printed
 * points, and this answer's marks; marks outside the table are left off the chart.
 */
export function describeFreezeChart(
	table: FreezeTable,
	marks: (ChartPoint & { label: string })[]
): ResultChart {
	const curve = findCurve(table);
	const max = tableMaxPercent(table);
	const points: ChartPoint[] = [];
	for (let percent = tableMinPercent(table); percent <= max; percent++) {
		points.push({ x: percent, y: roundTo(curve.evaluate(percent), table.freezePointDecimals) });
	}
	return {
		id: 'freeze-curve',
		kind: 'line',
		title: `Freeze point against glycol: ${table.title}`,
		x: { label: 'Glycol', unit: concentrationUnit(table.basis) },
		y: { label: 'Freezes at', unit: '°C' },
		points,
		tablePoints: table.points.map((p) => ({ x: p.percent, y: p.freezePointC })),
		marks: marks
			.filter((m) => m.x >= tableMinPercent(table) && m.x <= max)
			.map((m) => ({
				label: m.label,
				x: roundTo(m.x, 1),
				y: roundTo(m.y, table.freezePointDecimals)
			}))
	};
}

function describeBasis(table: FreezeTable): string {
	return `Freeze point table for ${table.title}: ${table.source}; 0 % is pure water (0 °C). Values between table points are interpolated with a monotone cubic (PCHIP); nothing outside the table is extrapolated.`;
}

function describeAccuracy(table: FreezeTable): string {
	return table.basis === 'mass'
		? 'The table is for pure ethylene glycol; commercial antifreeze with additives freezes within about 1–2 °C of it. Between table points the interpolation adds well under 0.5 °C.'
		: 'Published tables for commercial antifreeze differ by up to about 3 °C near 60 %, because of additives and how the freeze point is judged. Treat the answer as ±2 °C.';
}

function warnAboutStrength(percent: number): string[] {
	if (percent < GLYCOL_WARNING_PERCENT) return [];
	return [
		`Close to or above the ${GLYCOL_LIMIT_PERCENT} % limit: more glycol than about ${GLYCOL_LIMIT_PERCENT} % protects less against freezing, not more (US Army TM 5-6115-400-12), and equipment makers say not to exceed ${GLYCOL_LIMIT_PERCENT} % (${OPERATOR_MANUAL}).`
	];
}

export interface FreezePointInput {
	glycol: GlycolType;
	basis: ConcentrationBasis;
	percent: number;
}

export type FreezePointValues = {
	freezePoint: Quantity<'°C'>;
	concentration: Quantity<ConcentrationUnit>;
	glycol: GlycolType;
	table: FreezeTableId;
	interpolated: boolean;
};

export function checkFreezePointInput(input: FreezePointInput): CalculatorIssue[] {
	if (input.glycol === 'PG' && input.basis === 'mass') {
		return [
			{
				path: 'basis',
				message:
					'There is no propylene glycol freeze-point table by mass on file: give the concentration by volume.'
			}
		];
	}
	return checkConcentration(findFreezeTable(input.glycol, input.basis), input.percent, 'percent');
}

/** Freeze point of a water–glycol mix from its concentration. */
export function calculateFreezePoint(input: FreezePointInput): CalculatorResult<FreezePointValues> {
	throwIfIssues(checkFreezePointInput(input));
	const table = findFreezeTable(input.glycol, input.basis);
	const freezePointC = interpolateFreezePointC(table, input.percent);
	const position = locateInTable(table, input.percent);
	return {
		values: {
			freezePoint: toQuantity(freezePointC, '°C', table.freezePointDecimals),
			concentration: toQuantity(input.percent, concentrationUnit(table.basis)),
			glycol: table.glycol,
			table: table.id,
			interpolated: position.interpolated
		},
		basis: describeBasis(table),
		accuracy: describeAccuracy(table),
		warnings: warnAboutStrength(input.percent),
		cautions: [CAUTION_COOLANT_POISON],
		charts: [
			describeFreezeChart(table, [{ label: 'This mix', x: input.percent, y: freezePointC }])
		],
		steps: [
			`Table: ${table.title}.`,
			position.description,
			`${describeMix(table, input.percent)} freezes at about ${formatNumber(freezePointC, table.freezePointDecimals)} °C.`
		]
	};
}

export interface GlycolForFreezePointInput {
	glycol: GlycolType;
	basis: ConcentrationBasis;
	freezePointC: number;
}

export function checkGlycolForFreezePointInput(
	input: GlycolForFreezePointInput
): CalculatorIssue[] {
	if (input.glycol === 'PG' && input.basis === 'mass') {
		return [
			{
				path: 'basis',
				message:
					'There is no propylene glycol freeze-point table by mass on file: give the concentration by volume.'
			}
		];
	}
	return checkFreezePoint(
		findFreezeTable(input.glycol, input.basis),
		input.freezePointC,
		'freezePointC'
	);
}

/** Concentration that gives the freeze point asked for (the reverse of calculateFreezePoint). */
export function calculateGlycolForFreezePoint(
	input: GlycolForFreezePointInput
): CalculatorResult<FreezePointValues> {
	throwIfIssues(checkGlycolForFreezePointInput(input));
	const table = findFreezeTable(input.glycol, input.basis);
	const percent = interpolateGlycolPercent(table, input.freezePointC);
	const position = locateInTable(table, percent);
	return {
		values: {
			freezePoint: toQuantity(input.freezePointC, '°C'),
			concentration: toQuantity(percent, concentrationUnit(table.basis), 1),
			glycol: table.glycol,
			table: table.id,
			interpolated: position.interpolated
		},
		basis: describeBasis(table),
		accuracy: describeAccuracy(table),
		warnings: warnAboutStrength(percent),
		cautions: [CAUTION_COOLANT_POISON],
		charts: [describeFreezeChart(table, [{ label: 'Needed', x: percent, y: input.freezePointC }])],
		steps: [
			`Table: ${table.title}.`,
			position.description,
			`Protection to ${formatNumber(input.freezePointC, 2)} °C needs about ${formatNumber(percent, 1)} % ${glycolNames[table.glycol]} by ${table.basis}.`
		]
	};
}

export interface AdjustMixInput {
	glycol: GlycolType;
	/** Whole cooling system, litres. */
	capacityL: number;
	/** Current concentration, % by volume; give this or currentFreezePointC. */
	currentPercent?: number;
	/** Measured freeze point (refractometer or hydrometer), °C; give this or currentPercent. */
	currentFreezePointC?: number;
	targetFreezePointC: number;
	/** Glycol content of the fluid added to strengthen the mix, % by volume: 100 = concentrate. */
	refillPercent?: number;
}

export type AdjustMixFluid = 'concentrate' | 'premix' | 'water' | 'none';

export type AdjustMixValues = {
	drain: Quantity<'L'>;
	add: Quantity<'L'>;
	addFluid: AdjustMixFluid;
	currentConcentration: Quantity<'vol %'>;
	currentFreezePoint: Quantity<'°C'> | null;
	targetConcentration: Quantity<'vol %'>;
	targetFreezePoint: Quantity<'°C'>;
	glycol: GlycolType;
	table: FreezeTableId;
};

/** Closer than this (vol %) the mix is already at the target: no drain is worth doing. */
const MIX_TOLERANCE_PERCENT = 0.05;

export function checkAdjustMixInput(input: AdjustMixInput): CalculatorIssue[] {
	const issues: CalculatorIssue[] = [];
	const table = findFreezeTable(input.glycol, 'volume');
	issues.push(...checkRange(input.capacityL, inputRanges.capacityL, 'capacityL'));
	const hasPercent = input.currentPercent !== undefined;
	const hasFreezePoint = input.currentFreezePointC !== undefined;
	if (hasPercent && hasFreezePoint) {
		issues.push({
			path: 'currentPercent',
			message:
				'Give the current mix either as a concentration or as a measured freeze point, not both.'
		});
	} else if (!hasPercent && !hasFreezePoint) {
		issues.push({
			path: 'currentFreezePointC',
			message: 'Give the current mix: its measured freeze point or its concentration.'
		});
	} else if (hasPercent) {
		issues.push(
			...checkRange(input.currentPercent as number, inputRanges.glycolPercent, 'currentPercent')
		);
	} else {
		issues.push(
			...checkFreezePoint(table, input.currentFreezePointC as number, 'currentFreezePointC')
		);
	}
	const targetIssues = checkTargetFreezePoint(table, input.targetFreezePointC);
	issues.push(...targetIssues);
	const refillPercent = input.refillPercent ?? 100;
	if (checkRange(refillPercent, inputRanges.refillPercent, 'refillPercent').length > 0) {
		issues.push({
			path: 'refillPercent',
			message: 'The refill must contain more than 0 % and at most 100 % glycol.'
		});
	}
	if (issues.length > 0) return issues;

	const currentPercent = hasPercent
		? (input.currentPercent as number)
		: findCurve(table).invert(input.currentFreezePointC as number);
	const targetPercent = findCurve(table).invert(input.targetFreezePointC);
	if (targetPercent > currentPercent + MIX_TOLERANCE_PERCENT && refillPercent <= targetPercent) {
		issues.push({
			path: 'refillPercent',
			message: `A ${formatNumber(refillPercent, 1)} % refill cannot bring the mix up to ${formatNumber(targetPercent, 1)} %: you would have to drain more than the whole system (${formatNumber(input.capacityL, 2)} L). Use a stronger refill or concentrate.`
		});
	}
	return issues;
}

function checkTargetFreezePoint(table: FreezeTable, targetFreezePointC: number): CalculatorIssue[] {
	const path = 'targetFreezePointC';
	if (!Number.isFinite(targetFreezePointC)) {
		return [{ path, message: 'Target freeze point must be a number.' }];
	}
	if (targetFreezePointC > 0 && targetFreezePointC <= inputRanges.freezePointC.max) {
		return [
			{
				path,
				message: 'A target freeze point above 0 °C is not possible: water alone freezes at 0 °C.'
			}
		];
	}
	const physical = checkRange(targetFreezePointC, inputRanges.freezePointC, path);
	if (physical.length > 0) return physical;
	const lowest = lowestFreezePointC(table);
	if (targetFreezePointC < lowest) {
		const max = tableMaxPercent(table);
		const beyondLimit =
			max >= GLYCOL_LIMIT_PERCENT
				? `would need more than ${GLYCOL_LIMIT_PERCENT} % glycol, and more glycol than that protects less, not more`
				: `is beyond the table (${table.title}), which stops at ${max} %`;
		return [
			{
				path,
				message: `Protection to ${formatNumber(targetFreezePointC, 2)} °C ${beyondLimit}. Choose a target of ${formatNumber(lowest, 2)} °C or warmer.`
			}
		];
	}
	return [];
}

type MixFigures = {
	capacityL: number;
	currentPercent: number;
	targetPercent: number;
	refillPercent: number;
};

/** x = V (ct − c0) / (r − c0) to strengthen with the refill; with water (r = 0) to weaken. */
function findDrain(
	{ capacityL, currentPercent, targetPercent, refillPercent }: MixFigures,
	steps: string[]
): { drainL: number; addFluid: AdjustMixFluid } {
	const f1 = (n: number) => formatNumber(n, 1);
	if (Math.abs(targetPercent - currentPercent) <= MIX_TOLERANCE_PERCENT) {
		steps.push('The mix is already at the target: nothing to drain or add.');
		return { drainL: 0, addFluid: 'none' };
	}
	if (targetPercent > currentPercent) {
		const drainL =
			(capacityL * (targetPercent - currentPercent)) / (refillPercent - currentPercent);
		steps.push(
			`Drain = ${formatNumber(capacityL, 2)} L × (${f1(targetPercent)} − ${f1(currentPercent)}) / (${f1(refillPercent)} − ${f1(currentPercent)}) = ${formatNumber(drainL, 2)} L.`
		);
		return { drainL, addFluid: refillPercent >= 100 ? 'concentrate' : 'premix' };
	}
	const drainL = (capacityL * (currentPercent - targetPercent)) / currentPercent;
	steps.push(
		`Drain = ${formatNumber(capacityL, 2)} L × (${f1(currentPercent)} − ${f1(targetPercent)}) / ${f1(currentPercent)} = ${formatNumber(drainL, 2)} L.`
	);
	return { drainL, addFluid: 'water' };
}

/** The work at the vehicle, step by step, once the volume is known. */
function describeWork(
	addFluid: Exclude<AdjustMixFluid, 'none'>,
	drainL: number,
	refillStrength: string,
	glycol: string
): string[] {
	const fluidName =
		addFluid === 'water'
			? 'clean water (distilled or deionised where the coolant maker asks for it)'
			: addFluid === 'concentrate'
				? `${glycol} concentrate`
				: `${refillStrength} premixed coolant`;
	return [
		`With the engine cold and the cap released, drain ${formatNumber(drainL, 1)} L of coolant into a clean container.`,
		`Add ${formatNumber(drainL, 1)} L of ${fluidName}, then top up to the cold mark with the same fluid if the level is short.`,
		'Run the engine with the heater on full until the coolant has circulated, bleed any air, and let it cool.',
		'Recheck the freeze point with a refractometer or hydrometer; repeat with a smaller amount if it is not yet on target.'
	];
}

/** The chart's mark for the current mix, when its freeze point is known. */
function markNow(currentPercent: number, currentFreezePointC: number | null) {
	return currentFreezePointC === null
		? []
		: [{ label: 'Now', x: currentPercent, y: currentFreezePointC }];
}

/** The first step: the current mix as given, or as read from a measured freeze point. */
function describeCurrentMix(
	percentGiven: boolean,
	currentPercent: number,
	currentFreezePointC: number | null,
	glycol: string
): string {
	return percentGiven
		? `Current mix: ${formatNumber(currentPercent, 1)} % ${glycol} by volume${currentFreezePointC === null ? '' : `, which freezes at about ${formatNumber(currentFreezePointC, 1)} °C`}.`
		: `A measured freeze point of ${formatNumber(currentFreezePointC as number, 1)} °C means about ${formatNumber(currentPercent, 1)} % ${glycol} by volume.`;
}

/** Warnings on the adjustment: diluting a mix that already protects, too strong now or after. */
function warnAboutMix(
	addFluid: AdjustMixValues['addFluid'],
	mix: { currentPercent: number; currentFreezePointC: number | null; targetPercent: number },
	targetFreezePointC: number
): string[] {
	const warnings: string[] = [];
	if (
		addFluid === 'water' &&
		mix.currentFreezePointC !== null &&
		mix.currentFreezePointC <= targetFreezePointC
	) {
		warnings.push(
			'The current mix already protects to the target or lower; dilute only to bring it back to the specified strength.'
		);
	}
	if (mix.currentPercent > GLYCOL_LIMIT_PERCENT) {
		warnings.push(
			`The current mix is above ${GLYCOL_LIMIT_PERCENT} % glycol: it protects less against freezing than a ${GLYCOL_LIMIT_PERCENT} % mix and should be diluted.`
		);
	}
	warnings.push(...warnAboutStrength(mix.targetPercent));
	return warnings;
}

/**
 * How much coolant to drain and replace to reach a target freeze point, on a volume basis
 * (the way concentrate and premix are sold). Strengthening replaces drained coolant with the
 * refill; weakening replaces it with water. The volume drained, x, from a system of V litres
 * at c0 % reaching ct % with a refill of r %: x = V (ct − c0) / (r − c0); with water, r = 0.
 */
export function adjustMix(input: AdjustMixInput): CalculatorResult<AdjustMixValues> {
	throwIfIssues(checkAdjustMixInput(input));
	const table = findFreezeTable(input.glycol, 'volume');
	const curve = findCurve(table);
	const capacityL = input.capacityL;
	const refillPercent = input.refillPercent ?? 100;
	const currentPercent = input.currentPercent ?? curve.invert(input.currentFreezePointC as number);
	const currentFreezePointC =
		input.currentFreezePointC ??
		(currentPercent <= tableMaxPercent(table) ? curve.evaluate(currentPercent) : null);
	const targetPercent = curve.invert(input.targetFreezePointC);
	const glycol = glycolNames[table.glycol];
	const steps: string[] = [
		describeCurrentMix(
			input.currentPercent !== undefined,
			currentPercent,
			currentFreezePointC,
			glycol
		),
		`Protection to ${formatNumber(input.targetFreezePointC, 1)} °C needs about ${formatNumber(targetPercent, 1)} % ${glycol} by volume.`
	];

	const { drainL, addFluid } = findDrain(
		{ capacityL, currentPercent, targetPercent, refillPercent },
		steps
	);
	const warnings = warnAboutMix(
		addFluid,
		{ currentPercent, currentFreezePointC, targetPercent },
		input.targetFreezePointC
	);

	if (addFluid !== 'none') {
		steps.push(...describeWork(addFluid, drainL, `${formatNumber(refillPercent, 1)} %`, glycol));
	}

	return {
		values: {
			drain: toQuantity(drainL, 'L', 2),
			add: toQuantity(drainL, 'L', 2),
			addFluid,
			currentConcentration: toQuantity(currentPercent, 'vol %', 1),
			currentFreezePoint:
				currentFreezePointC === null ? null : toQuantity(currentFreezePointC, '°C', 1),
			targetConcentration: toQuantity(targetPercent, 'vol %', 1),
			targetFreezePoint: toQuantity(input.targetFreezePointC, '°C'),
			glycol: table.glycol,
			table: table.id
		},
		basis: `${describeBasis(table)} Mixing by volume: x = V (ct − c0) / (r − c0).`,
		accuracy:
			'Assumes the drained coolant has the average strength of the whole system and that volumes simply add (they shrink by about 1 %). Coolant left in the block and heater mixes in only after it circulates, so always recheck.',
		warnings,
		cautions: [CAUTION_HOT_CAP, CAUTION_COOLANT_POISON, CAUTION_FOLLOW_PROCEDURE],
		charts: [
			describeFreezeChart(table, [
				...markNow(currentPercent, currentFreezePointC),
				{ label: 'Target', x: targetPercent, y: input.targetFreezePointC }
			])
		],
		steps
	};
}
