// The calculators page: each calculator's form and its action.
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms/server';
import {
	calculatorForms,
	type CalculatorFormDefinition,
	type CalculatorFormMessage,
	type FormValues
} from '$lib/calculator-forms';
import {
	describeCalculatorSections,
	formAdapterFor,
	getShopIntervalSettings,
	runCalculatorForm
} from '$lib/server/calculators';
import { requirePermission } from '$lib/server/guard';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'calculators:use');
	const intervals = await getShopIntervalSettings(user.shopId);
	const today = new Date().toISOString().slice(0, 10);
	return { sections: await describeCalculatorSections({ today, intervals }) };
};

/** A body that is not a readable form (a broken multipart post) is a 400, not a 500. */
async function readFormData(request: Request): Promise<FormData | null> {
	try {
		return await request.formData();
	} catch {
		return null;
	}
}

/** One action per calculator: check the form, run the calculator, answer rows or field errors. */
function createCalculatorAction(definition: CalculatorFormDefinition): Action {
	return async (event) => {
		const user = requirePermission(event, 'calculators:use');
		const formData = await readFormData(event.request);
		if (!formData) return fail(400, { message: 'The form could not be read: send it again.' });
		const adapter = formAdapterFor(definition);
		const form = await superValidate(formData, adapter, { id: definition.calculator });
		if (!form.valid) return fail(400, { form });
		const outcome = await runCalculatorForm(user.shopId, definition, form.data as FormValues);
		if (outcome.ok) {
			const { result, rows } = outcome;
			return message(form, { kind: 'result', result, rows } satisfies CalculatorFormMessage);
		}
		for (const [field, text] of Object.entries(outcome.errors)) setError(form, field, text);
		const text = outcome.message ?? 'Please correct the marked fields.';
		return message(form, { kind: 'error', text } satisfies CalculatorFormMessage, { status: 400 });
	};
}

export const actions = Object.fromEntries(
	calculatorForms.map((definition) => [definition.action, createCalculatorAction(definition)])
) satisfies Actions;
