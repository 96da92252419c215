import { z } from 'zod';
import {
	CalculatorError,
	DEFAULT_INTERVAL_SETTINGS,
	calculatorNames,
	calculators,
	isCalculatorName,
	type CalculatorEntry,
	type CalculatorName,
	type CalculatorResult,
	type IntervalSettings
} from '$lib/calculators';
import { getShop } from './shops';
import { AppError } from './errors';
import { coolantIntervals } from './shops';

/** What a client needs to call a calculator: its name, what it does and the JSON it takes. */
export type CalculatorSummary = {
	name: CalculatorName;
	title: string;
	description: string;
	inputSchema: Record<string, unknown>;
};

let summaries: CalculatorSummary[] | undefined;

/** Every calculator of the registry, with its input as JSON Schema generated from the zod schema. */
export function listCalculators(): CalculatorSummary[] {
	summaries ??= calculatorNames.map((name) => {
		const entry = calculators[name];
		return {
			name,
			title: entry.title,
			description: entry.description,
			inputSchema: z.toJSONSchema(entry.inputSchema, { io: 'input' }) as Record<string, unknown>
		};
	});
	return summaries;
}

/** The registry entry for an endpoint name; an unknown name is 404, like any missing thing. */
export function findCalculator(name: string): CalculatorEntry & { name: CalculatorName } {
	if (!isCalculatorName(name)) {
		throw new AppError(
			'not_found',
			`There is no calculator called "${name}". Available: ${calculatorNames.join(', ')}.`
		);
	}
	return calculators[name] as CalculatorEntry & { name: CalculatorName };
}

/** The shop's coolant change interval, completed with the calculator's due-soon margins. */
export async function getShopIntervalSettings(shopId: string): Promise<IntervalSettings> {
	const shop = await getShop(shopId);
	return { ...DEFAULT_INTERVAL_SETTINGS, ...coolantIntervals(shop.settings) };
}

const isPlainObject = (value: unknown): value is Record<string, unknown> =>
	typeof value === 'object' && value !== null && !Array.isArray(value);

/**
 * Fills the settings a request leaves out with the shop's own, field by field. Input that is not
 * shaped like a request is passed on untouched so that the schema reports it at its field.
 */
export function applyShopIntervals(input: unknown, shopSettings: IntervalSettings): unknown {
	if (!isPlainObject(input)) return input;
	if (input.settings !== undefined && !isPlainObject(input.settings)) return input;
	return { ...input, settings: { ...shopSettings, ...(input.settings ?? {}) } };
}

/** A calculator's refusal in the contract's terms: 400 with every issue at its field. */
export function toAppError(error: CalculatorError): AppError {
	return new AppError('invalid_request', error.message, { issues: error.issues });
}

/**
 * Runs a calculator for a caller of a shop. The service-interval calculator counts with the
 * shop's interval settings wherever the input gives none. Bad input throws an AppError and never
 * yields a number.
 */
export async function runCalculatorForShop(
	shopId: string,
	name: string,
	input: unknown
): Promise<CalculatorResult> {
	const entry = findCalculator(name);
	const prepared =
		entry.name === 'service-interval'
			? applyShopIntervals(input, await getShopIntervalSettings(shopId))
			: input;
	try {
		return entry.run(prepared);
	} catch (error) {
		if (error instanceof CalculatorError) throw toAppError(error);
		throw error;
	}
}
