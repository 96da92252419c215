// The calculators' input schemas and registry: what each endpoint and form accepts.
import { z } from 'zod';
import { boilingPointUnderCap, checkBoilingPointInput } from './boiling-point';
import { calculateDrainFill, checkDrainFillInput } from './drain-fill';
import { CalculatorError, type CalculatorIssue } from './errors';
import { formatIssuePath } from './format';
import {
	adjustMix,
	calculateFreezePoint,
	calculateGlycolForFreezePoint,
	checkAdjustMixInput,
	checkFreezePointInput,
	checkGlycolForFreezePointInput
} from './freeze-point';
import {
	describeNotWhole,
	describeTooHigh,
	describeTooLow,
	inputRanges,
	type InputRange,
	type RangeName
} from './ranges';
import type { CalculatorResult } from './result';
import { calculateServiceInterval, checkServiceIntervalInput } from './service-interval';
import { calculateConversion, checkConversionInput, pressureUnits } from './units';

export { CalculatorError } from './errors';
export type { CalculatorIssue } from './errors';
export type { CalculatorResult, Quantity } from './result';

/**
 * Input schemas for the calculators' JSON endpoints and form. Shape and type problems are
 * caught here; the rules between fields (drain ≤ capacity, a target a table can reach) come
 * from each calculator's own check, so the endpoint and the function say the same thing.
 */
function requiredNumber(label: string) {
	return z.number({
		error: (issue) =>
			issue.input === undefined ? `${label} is required.` : `${label} must be a number.`
	});
}

/**
 * A number with its physical range from ranges.ts: the JSON Schema then shows the bounds, and the
 * messages are the ones the calculator itself gives for a value out of range.
 */
function rangedNumber(name: RangeName, label: string = inputRanges[name].label) {
	const range: InputRange = inputRanges[name];
	const base = requiredNumber(label);
	const low = range.minExclusive
		? base.gt(range.min, describeTooLow(range))
		: base.gte(range.min, describeTooLow(range));
	const bounded = low.lte(range.max, describeTooHigh(range));
	return range.integer ? bounded.int(describeNotWhole(range)) : bounded;
}

function requiredString(label: string) {
	return z.string({
		error: (issue) =>
			issue.input === undefined ? `${label} is required.` : `${label} must be text.`
	});
}

/** Rejects misspelt field names instead of silently ignoring them. */
function strictObject<T extends z.core.$ZodLooseShape>(shape: T) {
	return z.strictObject(shape, {
		error: (issue) =>
			issue.code === 'unrecognized_keys'
				? `Unknown field${issue.keys.length === 1 ? '' : 's'}: ${issue.keys.join(', ')}.`
				: 'Send the input as a JSON object.'
	});
}

/** Runs a calculator's own cross-field check and reports its issues at their fields. */
function addIssues(ctx: z.RefinementCtx, issues: CalculatorIssue[]): void {
	for (const issue of issues) {
		ctx.addIssue({
			code: 'custom',
			message: issue.message,
			path: issue.path.split('.').filter(Boolean)
		});
	}
}

const glycolSchema = z.enum(['EG', 'PG'], {
	error: 'Glycol must be "EG" (ethylene glycol) or "PG" (propylene glycol).'
});
const basisSchema = z.enum(['mass', 'volume'], {
	error: 'Concentration basis must be "mass" or "volume".'
});

export const conversionInputSchema = strictObject({
	value: requiredNumber('Value'),
	from: requiredString('Unit to convert from'),
	to: requiredString('Unit to convert to')
}).superRefine((input, ctx) => addIssues(ctx, checkConversionInput(input)));

export const freezePointInputSchema = strictObject({
	glycol: glycolSchema,
	basis: basisSchema,
	percent: rangedNumber('glycolPercent')
}).superRefine((input, ctx) => addIssues(ctx, checkFreezePointInput(input)));

export const glycolForFreezePointInputSchema = strictObject({
	glycol: glycolSchema,
	basis: basisSchema,
	freezePointC: rangedNumber('freezePointC')
}).superRefine((input, ctx) => addIssues(ctx, checkGlycolForFreezePointInput(input)));

export const adjustMixInputSchema = strictObject({
	glycol: glycolSchema,
	capacityL: rangedNumber('capacityL'),
	currentPercent: rangedNumber('glycolPercent').optional(),
	currentFreezePointC: rangedNumber('freezePointC', 'Measured freeze point').optional(),
	targetFreezePointC: rangedNumber('freezePointC', 'Target freeze point'),
	refillPercent: rangedNumber('refillPercent').optional()
}).superRefine((input, ctx) => addIssues(ctx, checkAdjustMixInput(input)));

export const drainFillInputSchema = strictObject({
	capacityL: rangedNumber('capacityL'),
	drainL: rangedNumber('drainL'),
	cycles: rangedNumber('cycles').optional(),
	targetFreshPercent: rangedNumber('targetFreshPercent').optional()
}).superRefine((input, ctx) => addIssues(ctx, checkDrainFillInput(input)));

export const boilingPointInputSchema = strictObject({
	capGauge: strictObject({
		value: requiredNumber('Cap pressure'),
		unit: z.enum(pressureUnits, {
			error: `Cap pressure unit must be one of: ${pressureUnits.join(', ')}.`
		})
	}),
	altitudeM: rangedNumber('altitudeM').optional(),
	glycol: strictObject({
		type: z.literal('EG', {
			error: 'The boiling estimate covers ethylene glycol ("EG") mixes only.'
		}),
		percent: rangedNumber('glycolPercent'),
		basis: basisSchema
	}).optional()
}).superRefine((input, ctx) => addIssues(ctx, checkBoilingPointInput(input)));

const isoDate = (label: string) =>
	requiredString(label).regex(/^\d{4}-\d{2}-\d{2}$/, `${label} must be written as YYYY-MM-DD.`);

export const serviceIntervalInputSchema = strictObject({
	lastChange: z.discriminatedUnion(
		'kind',
		[
			strictObject({
				kind: z.literal('changed'),
				date: isoDate('Date of the last change'),
				odometerKm: rangedNumber('odometerKm', 'The odometer at the last change')
			}),
			strictObject({
				kind: z.literal('never'),
				inServiceDate: isoDate('In-service date')
			})
		],
		{
			error:
				'Say whether the coolant was changed ("changed", with date and odometer) or never changed ("never", with the in-service date).'
		}
	),
	currentDate: isoDate("Today's date"),
	currentOdometerKm: rangedNumber('odometerKm', 'The current odometer reading'),
	averageKmPerDay: rangedNumber('averageKmPerDay').optional(),
	settings: strictObject({
		firstChangeKm: rangedNumber('firstChangeKm').optional(),
		thenEveryKm: rangedNumber('thenEveryKm').optional(),
		everyMonths: rangedNumber('everyMonths').optional(),
		dueSoonDays: rangedNumber('dueSoonDays').optional(),
		dueSoonKm: rangedNumber('dueSoonKm').optional()
	}).optional()
}).superRefine((input, ctx) => addIssues(ctx, checkServiceIntervalInput(input)));

export const quantitySchema = z.object({ value: z.number(), unit: z.string() });

const chartPointSchema = z.object({ x: z.number(), y: z.number() });
const chartAxisSchema = z.object({ label: z.string(), unit: z.string() });

/** A chart of the answer, in the result's own numbers (see ResultChart). */
export const resultChartSchema = z.object({
	id: z.string(),
	kind: z.enum(['line', 'bars']),
	title: z.string(),
	x: chartAxisSchema,
	y: chartAxisSchema,
	points: z.array(chartPointSchema),
	tablePoints: z.array(chartPointSchema).optional(),
	marks: z.array(chartPointSchema.extend({ label: z.string() })).optional(),
	target: z.object({ label: z.string(), y: z.number() }).optional()
});

/** The one result shape every calculator returns (for the OpenAPI document and for clients). */
export const calculatorResultSchema = z.object({
	values: z.record(z.string(), z.union([quantitySchema, z.string(), z.boolean(), z.null()])),
	basis: z.string(),
	accuracy: z.string().optional(),
	warnings: z.array(z.string()),
	cautions: z.array(z.string()),
	steps: z.array(z.string()).optional(),
	charts: z.array(resultChartSchema).optional()
});

/** Turns a schema failure into the calculators' one error type, with every issue at its field. */
export function parseCalculatorInput<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
	const parsed = schema.safeParse(input);
	if (parsed.success) return parsed.data;
	// The field's range and the calculator's own check can both report a value out of range.
	const seen = new Set<string>();
	const issues = parsed.error.issues
		.map((issue) => ({ path: formatIssuePath(issue.path), message: issue.message }))
		.filter((issue) => {
			const key = `${issue.path}\n${issue.message}`;
			if (seen.has(key)) return false;
			seen.add(key);
			return true;
		});
	const first = issues[0];
	throw new CalculatorError(first.message, first.path || undefined, issues);
}

export interface CalculatorEntry<S extends z.ZodType = z.ZodType> {
	name: string;
	title: string;
	description: string;
	inputSchema: S;
	/** Validates raw input (a JSON body or form values) and calculates; throws CalculatorError. */
	run(input: unknown): CalculatorResult;
}

function defineCalculator<S extends z.ZodType>(
	name: string,
	title: string,
	description: string,
	inputSchema: S,
	calculate: (input: z.output<S>) => CalculatorResult
): CalculatorEntry<S> {
	return {
		name,
		title,
		description,
		inputSchema,
		run: (input) => calculate(parseCalculatorInput(inputSchema, input))
	};
}

export const calculators = {
	'unit-conversion': defineCalculator(
		'unit-conversion',
		'Unit conversion',
		'Volume, pressure, torque and temperature between SI and US or imperial units, with exact factors.',
		conversionInputSchema,
		calculateConversion
	),
	'freeze-point': defineCalculator(
		'freeze-point',
		'Freeze point of a coolant mix',
		'Freeze point of an ethylene or propylene glycol mix from its concentration, from published tables.',
		freezePointInputSchema,
		calculateFreezePoint
	),
	'glycol-for-freeze-point': defineCalculator(
		'glycol-for-freeze-point',
		'Glycol needed for a freeze point',
		'Concentration of ethylene or propylene glycol that protects down to a given freeze point.',
		glycolForFreezePointInputSchema,
		calculateGlycolForFreezePoint
	),
	'mix-adjustment': defineCalculator(
		'mix-adjustment',
		'Correct the coolant mix',
		'How much coolant to drain and replace with concentrate (or water) to reach a target freeze point.',
		adjustMixInputSchema,
		adjustMix
	),
	'drain-and-fill': defineCalculator(
		'drain-and-fill',
		'Partial drain-and-fill',
		'Share of fresh coolant after repeated partial drains, and the cycles needed to reach a target.',
		drainFillInputSchema,
		calculateDrainFill
	),
	'boiling-point': defineCalculator(
		'boiling-point',
		'Boiling point under the cap',
		'Boiling point of water or an ethylene glycol mix under a pressure cap, at any altitude.',
		boilingPointInputSchema,
		boilingPointUnderCap
	),
	'service-interval': defineCalculator(
		'service-interval',
		'Next coolant change',
		'When the next coolant change is due, by distance or by time, whichever comes first.',
		serviceIntervalInputSchema,
		calculateServiceInterval
	)
} as const;

export type CalculatorName = keyof typeof calculators;
export const calculatorNames = Object.keys(calculators) as CalculatorName[];

export function isCalculatorName(name: string): name is CalculatorName {
	return Object.hasOwn(calculators, name);
}

/** Looks a calculator up by its endpoint name and runs it on raw input. */
export function runCalculator(name: string, input: unknown): CalculatorResult {
	if (!isCalculatorName(name)) {
		throw new CalculatorError(
			`There is no calculator called "${name}". Available: ${calculatorNames.join(', ')}.`,
			'name'
		);
	}
	return calculators[name].run(input);
}
