// The fields of a calculator's form as data, and reading typed numbers.
import { z } from 'zod';

/**
 * The fields of a calculator's form, written once as data: the page draws them, the form schema
 * (sveltekit-superforms, zod adapter) checks them, and the definition reads them into the
 * calculator's JSON input. Numbers travel as text so that "50,5" and "forty" can be told apart.
 */
export type FormValues = Record<string, string>;
export type FieldErrors = Record<string, string>;

export type Option = { value: string; label: string; group?: string };

type FieldBase = {
	name: string;
	label: string;
	hint?: string;
	required?: boolean;
	/** Shown only while another field has this value (all are shown without JavaScript). */
	showWhen?: { field: string; value: string };
};

export type NumberFieldSpec = FieldBase & {
	kind: 'number';
	/** Negative values are usual: keep the full keyboard so a tablet offers the minus key. */
	signed?: boolean;
	/** The unit chosen beside the number, itself a form field. */
	unit?: { name: string; choices: readonly string[] };
};
export type SelectFieldSpec = FieldBase & { kind: 'select'; options: Option[] };
export type ChoiceFieldSpec = FieldBase & { kind: 'choice'; options: Option[] };
export type DateFieldSpec = FieldBase & { kind: 'date' };
export type GroupSpec = {
	kind: 'group';
	name: string;
	legend?: string;
	hint?: string;
	columns: 1 | 2 | 3;
	fields: FieldSpec[];
	showWhen?: { field: string; value: string };
};
export type LeafSpec = NumberFieldSpec | SelectFieldSpec | ChoiceFieldSpec | DateFieldSpec;
export type FieldSpec = LeafSpec | GroupSpec;

export const options = (values: readonly string[]): Option[] =>
	values.map((value) => ({ value, label: value }));

export function leafFields(fields: readonly FieldSpec[]): LeafSpec[] {
	return fields.flatMap((field) => (field.kind === 'group' ? leafFields(field.fields) : [field]));
}

/** The longest text a number or date field takes; anything longer is not a figure. */
const MAX_TEXT = 40;
const PLAIN_NUMBER = /^[-+]?(\d+([.,]\d*)?|[.,]\d+)$/;
/** "1,500" could be one and a half or fifteen hundred: the form asks instead of guessing. */
const GROUPED_THOUSANDS = /^[-+]?[1-9]\d{0,2},\d{3}$/;

/** Why a typed number cannot be read, or null when it can (an empty field reads as unset). */
export function checkNumberText(text: string, label: string): string | null {
	const trimmed = normaliseMinus(text.trim());
	if (trimmed === '') return null;
	if (GROUPED_THOUSANDS.test(trimmed)) {
		return `${label}: "${trimmed}" could mean ${trimmed.replace(',', '.')} or ${trimmed.replace(',', '')}. Write it without the comma, or with a point for decimals.`;
	}
	if (!PLAIN_NUMBER.test(trimmed)) {
		return `${label} must be a number, such as 50.5 or 50,5 (no letters or units).`;
	}
	return null;
}

const normaliseMinus = (text: string) => text.replace(/^\u2212/, '-');

/** Reads a number as typed, with a point or a comma for decimals; empty is undefined. */
export function readFormNumber(text: string | undefined): number | undefined {
	const trimmed = normaliseMinus((text ?? '').trim());
	if (trimmed === '') return undefined;
	if (checkNumberText(trimmed, '') !== null) return Number.NaN;
	return Number(trimmed.replace(',', '.'));
}

function leafSchema(field: LeafSpec) {
	if (field.kind === 'select' || field.kind === 'choice') {
		const values = field.options.map((o) => o.value) as [string, ...string[]];
		return z.enum(values, {
			error: `Choose one of: ${field.options.map((o) => o.label).join(', ')}.`
		});
	}
	const text = z.string().trim().max(MAX_TEXT, `${field.label}: at most ${MAX_TEXT} characters.`);
	if (field.kind === 'date') return text;
	return text.superRefine((value, ctx) => {
		const problem = checkNumberText(value, field.label);
		if (problem) ctx.addIssue({ code: 'custom', message: problem });
	});
}

/** The form's schema for superforms: every field as text or a choice, nothing unknown kept. */
export function buildFormSchema(fields: readonly FieldSpec[]) {
	const shape: Record<string, z.ZodType> = {};
	for (const field of leafFields(fields)) {
		shape[field.name] = leafSchema(field);
		if (field.kind === 'number' && field.unit) {
			shape[field.unit.name] = z.enum(field.unit.choices as [string, ...string[]], {
				error: `Choose one of: ${field.unit.choices.join(', ')}.`
			});
		}
	}
	return z.object(shape);
}
