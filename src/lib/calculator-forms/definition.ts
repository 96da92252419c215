// The shape of one calculator's form definition and of the message its action returns.
import type { SuperValidated } from 'sveltekit-superforms';
import type { CalculatorName, CalculatorResult, IntervalSettings } from '../calculators';
import type { DisplayRow } from './display';
import type { FieldErrors, FieldSpec, FormValues } from './fields';

/**
 * One calculator's form, defined once: its fields (drawn by the page and checked by the form
 * schema), how the typed values become the calculator's input, and how its result reads.
 */
export interface CalculatorFormDefinition {
	calculator: CalculatorName;
	/** The page's form action for this calculator. */
	action: string;
	/** The name in the page's list of calculators. */
	short: string;
	/** Shown before anything is calculated; a result brings its own. */
	cautions: string[];
	fields: FieldSpec[];
	defaults(context: FormContext): FormValues;
	/** Where a calculator's issue path is shown on the form. */
	fieldOf: Readonly<Record<string, string>>;
	toInput(values: FormValues): { input: unknown; errors: FieldErrors };
	present(result: CalculatorResult, values: FormValues): DisplayRow[];
}

export type FormContext = { today: string; intervals: IntervalSettings };

/** What a calculator form's message carries: the answer and its rows, or what went wrong. */
export type CalculatorFormMessage =
	| { kind: 'result'; result: CalculatorResult; rows: DisplayRow[] }
	| { kind: 'error'; text: string };

/** One calculator's section of the page, as the server sends it to be drawn. */
export type CalculatorSection = {
	calculator: CalculatorName;
	action: string;
	short: string;
	title: string;
	description: string;
	cautions: string[];
	fields: FieldSpec[];
	form: SuperValidated<FormValues, CalculatorFormMessage>;
};
