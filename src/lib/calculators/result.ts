// The one result shape every calculator returns: quantities with units, basis, warnings, steps.
import { roundTo } from './format';

/**
 * The one shape every calculator returns. Every number travels with its unit as
 * `{ value, unit }`, so no client has to guess whether a figure is °C or °F, L or US qt.
 */
export interface Quantity<U extends string = string> {
	value: number;
	unit: U;
}

export type ResultValue = Quantity | string | boolean | null;

export interface CalculatorResult<
	V extends Record<string, ResultValue> = Record<string, ResultValue>
> {
	/** The answers: quantities with units, plus labels such as a status or a table id. */
	values: V;
	/** Which table or equation the answer comes from, and its published source. */
	basis: string;
	/** How far the answer can be trusted, where that is known. */
	accuracy?: string;
	/** Things about this input the person should know before acting on the answer. */
	warnings: string[];
	/** Safety cautions for the work the answer leads to. */
	cautions: string[];
	/** The working, in order, in words a technician can follow or repeat by hand. */
	steps?: string[];
	/** The answer drawn: the curve or bars it comes from, in the result's own numbers. */
	charts?: ResultChart[];
}

export interface ChartPoint {
	x: number;
	y: number;
}

/** A chart a client can draw as it is, with a table of the same numbers beside it. */
export interface ResultChart {
	id: string;
	kind: 'line' | 'bars';
	title: string;
	x: { label: string; unit: string };
	y: { label: string; unit: string };
	/** The curve (line) or one bar per x (bars). */
	points: ChartPoint[];
	/** Points printed in the source table, which the curve passes through. */
	tablePoints?: ChartPoint[];
	/** This answer's own points on the chart, such as "This mix". */
	marks?: (ChartPoint & { label: string })[];
	/** A level to compare with, drawn as a line across, such as a target. */
	target?: { label: string; y: number };
}

/** A quantity rounded to the resolution its source supports (none when `decimals` is left out). */
export function toQuantity<U extends string>(
	value: number,
	unit: U,
	decimals?: number
): Quantity<U> {
	return { value: decimals === undefined ? value : roundTo(value, decimals), unit };
}
