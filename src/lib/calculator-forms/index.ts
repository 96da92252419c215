// The calculators' forms in page order, and the form helpers the page uses.
import { boilingPointForm } from './boiling-point';
import type { CalculatorFormDefinition } from './definition';
import { drainAndFillForm } from './drain-and-fill';
import { freezePointForm, glycolForFreezePointForm } from './freeze-point';
import { mixAdjustmentForm } from './mix-adjustment';
import { serviceIntervalForm } from './service-interval';
import { unitConversionForm } from './unit-conversion';

/** The calculators' forms in page order, one definition each (see definition.ts). */
export const calculatorForms: readonly CalculatorFormDefinition[] = [
	freezePointForm,
	glycolForFreezePointForm,
	mixAdjustmentForm,
	drainAndFillForm,
	boilingPointForm,
	serviceIntervalForm,
	unitConversionForm
];

export type {
	CalculatorFormDefinition,
	CalculatorFormMessage,
	CalculatorSection,
	FormContext
} from './definition';
export type { DisplayRow } from './display';
export * from './fields';
