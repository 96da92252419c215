// The calculators' public surface: every calculator, its schema and its helpers.
export * from './errors';
export * from './result';
export * from './cautions';
export * from './format';
export * from './pchip';
export * from './units';
export * from './freeze-point';
export * from './drain-fill';
export * from './boiling-point';
export * from './service-interval';
export {
	adjustMixInputSchema,
	boilingPointInputSchema,
	calculatorNames,
	calculatorResultSchema,
	calculators,
	conversionInputSchema,
	drainFillInputSchema,
	freezePointInputSchema,
	glycolForFreezePointInputSchema,
	isCalculatorName,
	parseCalculatorInput,
	quantitySchema,
	runCalculator,
	serviceIntervalInputSchema
} from './schemas';
export type { CalculatorEntry, CalculatorName } from './schemas';
export * from './ranges';
