// The calculators on the server: the API's list of them, the shop's intervals, contract errors.
import { superValidate, type SuperValidated } from 'sveltekit-superforms/server';
import { zod4 } from 'sveltekit-superforms/adapters';
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
} from '../calculators';
import {
	buildFormSchema,
	calculatorForms,
	type CalculatorFormDefinition,
	type CalculatorFormMessage,
	type CalculatorSection,
	type DisplayRow,
	type FieldErrors,
	type FormContext,
	type FormValues
} from '../calculator-forms';
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

type FormAdapter = ReturnType<typeof zod4<ReturnType<typeof buildFormSchema>>>;
const adapters = new Map<CalculatorName, FormAdapter>();

/** The superforms adapter of a calculator's form, built once from its field definitions. */
export function formAdapterFor(definition: CalculatorFormDefinition): FormAdapter {
	let adapter = adapters.get(definition.calculator);
	if (!adapter) {
		adapter = zod4(buildFormSchema(definition.fields));
		adapters.set(definition.calculator, adapter);
	}
	return adapter;
}

/** Every calculator's section of the page: its fields, texts and a form with the defaults. */
export async function describeCalculatorSections(
	context: FormContext
): Promise<CalculatorSection[]> {
	return Promise.all(
		calculatorForms.map(async (definition) => {
			const entry = calculators[definition.calculator];
			const form = await superValidate(definition.defaults(context), formAdapterFor(definition), {
				id: definition.calculator,
				errors: false
			});
			return {
				calculator: definition.calculator,
				action: definition.action,
				short: definition.short,
				title: entry.title,
				description: entry.description,
				cautions: definition.cautions,
				fields: definition.fields,
				form: form as SuperValidated<FormValues, CalculatorFormMessage>
			};
		})
	);
}

/**
 * Runs a calculator from its form's values: the values become the calculator's input, and its
 * refusal comes back as messages at the form's fields (or one message for the form).
 */
export async function runCalculatorForm(
	shopId: string,
	definition: CalculatorFormDefinition,
	values: FormValues
): Promise<
	| { ok: true; result: CalculatorResult; rows: DisplayRow[] }
	| { ok: false; errors: FieldErrors; message?: string }
> {
	const { input, errors } = definition.toInput(values);
	if (Object.keys(errors).length > 0) return { ok: false, errors };
	try {
		const result = await runCalculatorForShop(shopId, definition.calculator, input);
		return { ok: true, result, rows: definition.present(result, values) };
	} catch (error) {
		if (!(error instanceof AppError) || error.code !== 'invalid_request') throw error;
		const placed: FieldErrors = {};
		const unplaced: string[] = [];
		for (const issue of error.options.issues ?? [{ path: '', message: error.message }]) {
			const field = definition.fieldOf[issue.path];
			if (field) placed[field] ??= issue.message;
			else unplaced.push(issue.message);
		}
		return { ok: false, errors: placed, message: unplaced.join(' ') || undefined };
	}
}
