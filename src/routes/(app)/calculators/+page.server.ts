import { fail } from '@sveltejs/kit';
import { calculators } from '$lib/calculators';
import { getShopIntervalSettings, runCalculatorForShop } from '$lib/server/calculators';
import { AppError } from '$lib/server/errors';
import { requirePermission } from '$lib/server/guard';
import type { Action, Actions, PageServerLoad } from './$types';
import {
	altitudeChoices,
	boilingPointForm,
	conversionUnitGroups,
	createFormDefaults,
	describeFreezeCurves,
	drainAndFillForm,
	freezePointForm,
	glycolForFreezePointForm,
	mixAdjustmentForm,
	placeIssues,
	pressureChoices,
	readFormValues,
	serviceIntervalForm,
	temperatureChoices,
	unitConversionForm,
	volumeChoices,
	type CalculatorForm
} from './calculator-forms';

const freezeCurves = describeFreezeCurves();

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'calculators:use');
	const intervals = await getShopIntervalSettings(user.shopId);
	const today = new Date().toISOString().slice(0, 10);
	return {
		defaults: createFormDefaults(today, intervals),
		titles: Object.fromEntries(
			Object.values(calculators).map((c) => [
				c.name,
				{ title: c.title, description: c.description }
			])
		),
		freezeCurves,
		conversionUnitGroups,
		// Sent from here so the browser bundle does not carry the calculators and their schemas.
		choices: {
			temperature: temperatureChoices,
			volume: volumeChoices,
			pressure: pressureChoices,
			altitude: altitudeChoices
		}
	};
};

/** One action per calculator: read the form, convert units, run, and answer rows or field errors. */
function createCalculatorAction(form: CalculatorForm): Action {
	return async (event) => {
		const user = requirePermission(event, 'calculators:use');
		const values = readFormValues(await event.request.formData(), form.fields);
		const calculator = form.calculator;
		const { input, errors } = form.toInput(values);
		if (Object.keys(errors).length > 0) {
			return fail(400, {
				calculator,
				message: 'Please correct the marked fields.',
				errors,
				values
			});
		}
		try {
			const result = await runCalculatorForShop(user.shopId, calculator, input);
			return { calculator, values, result, ...form.present(result, values) };
		} catch (error) {
			if (!(error instanceof AppError) || error.code !== 'invalid_request') throw error;
			const placed = placeIssues(
				form,
				error.options.issues ?? [{ path: '', message: error.message }]
			);
			const message =
				placed.unplaced.length > 0
					? placed.unplaced.join(' ')
					: 'Please correct the marked fields.';
			return fail(400, { calculator, message, errors: placed.errors, values });
		}
	};
}

const freezePointAction = createCalculatorAction(freezePointForm);
const glycolForFreezePointAction = createCalculatorAction(glycolForFreezePointForm);
const mixAdjustmentAction = createCalculatorAction(mixAdjustmentForm);
const drainAndFillAction = createCalculatorAction(drainAndFillForm);
const boilingPointAction = createCalculatorAction(boilingPointForm);
const serviceIntervalAction = createCalculatorAction(serviceIntervalForm);
const unitConversionAction = createCalculatorAction(unitConversionForm);

export const actions = {
	freezePoint: freezePointAction,
	glycolForFreezePoint: glycolForFreezePointAction,
	mixAdjustment: mixAdjustmentAction,
	drainAndFill: drainAndFillAction,
	boilingPoint: boilingPointAction,
	serviceInterval: serviceIntervalAction,
	unitConversion: unitConversionAction
} satisfies Actions;
