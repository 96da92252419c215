/** Reading form posts with zod, and the form answers for a failed parse or a domain failure. */
import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { AppError } from './errors';

export type FieldErrors = Record<string, string>;

/**
 * Parses a form post with a zod schema. Only string fields are read (a file or a repeated field
 * fails the schema like any other bad value), and the first message per field is kept. `values`
 * holds the string fields as sent, safe to send back to the form (never a file).
 */
export function parseForm<S extends z.ZodType>(
	schema: S,
	formData: FormData
):
	| { ok: true; data: z.infer<S> }
	| { ok: false; errors: FieldErrors; values: Record<string, string> } {
	// Own keys only, so a field named `constructor` or `__proto__` is just a field.
	const raw: Record<string, unknown> = Object.create(null);
	const values: Record<string, string> = Object.create(null);
	for (const [key, value] of formData) {
		if (Object.hasOwn(raw, key)) raw[key] = [raw[key], value].flat();
		else raw[key] = typeof value === 'string' ? value : null;
		if (typeof value === 'string' && !Object.hasOwn(values, key)) values[key] = value;
	}
	const result = schema.safeParse(raw);
	if (result.success) return { ok: true, data: result.data };
	const errors: FieldErrors = {};
	for (const issue of result.error.issues) {
		const field = String(issue.path[0] ?? 'form');
		errors[field] ??= issue.message;
	}
	return { ok: false, errors, values: { ...values } }; // failForm leaves out what it cannot send
}

/**
 * The values a form answer may send back: plain values only (never a file), and no `__proto__`
 * key, which the answer's serializer refuses (a 500).
 */
function echoable(values: Record<string, unknown>): Record<string, unknown> {
	return Object.fromEntries(
		Object.entries(values).filter(
			([key, value]) =>
				key !== '__proto__' && ['string', 'number', 'boolean'].includes(typeof value)
		)
	);
}

/** The form's answer for a failed parse: 400 with field messages and the safe values back. */
export function failForm(errors: FieldErrors, values: Record<string, unknown> = {}) {
	return fail(400, {
		message: 'Please correct the marked fields.',
		errors,
		values: echoable(values)
	});
}

/** An expected domain failure as a form answer; anything else is rethrown. */
export function failFromError(err: unknown, values: Record<string, unknown> = {}) {
	if (!(err instanceof AppError)) throw err;
	const status =
		err.code === 'conflict' ? 409 : err.status >= 400 && err.status < 500 ? err.status : 400;
	const errors: FieldErrors = err.options.field ? { [err.options.field]: err.message } : {};
	return fail(status, { message: err.message, errors, values: echoable(values) });
}

export const emailField = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter a valid e-mail address.' }))
	.refine((v) => v.length <= 254, 'That e-mail address is too long.');

export const passwordField = z
	.string({ error: 'Enter a password.' })
	.min(1, 'Enter a password.')
	.max(256, 'Use at most 256 characters.');

export const nameField = (label: string) =>
	z
		.string({ error: `Enter ${label}.` })
		.trim()
		.min(1, `Enter ${label}.`)
		.max(120, `Keep ${label} under 120 characters.`);
