// The rank page's shapes: the diagnose answer it draws and how an observation's value reads.

export type Value = boolean | string | number;

/** An observation as the page's load sends it. */
export interface PageObservation {
	key: string;
	prompt: string;
	kind: string;
	values: Value[];
	valueLabels: Record<string, string>;
	unit?: string;
	min?: number;
	max?: number;
	cautions: string[];
}

export type Cause = {
	key: string;
	name: string;
	probability: number;
	band: string;
	evidence: { rule: string; lr: number; because: string }[];
};
export type Question = {
	key: string;
	prompt: string;
	expectedGain: number;
	group?: string;
	lowValue?: boolean;
};
export type Test = {
	key: string;
	name: string;
	minutes: number;
	priority: number;
	cautions: string[];
	targets: string[];
	sets: string;
	equipment?: string[];
};
export type Result = {
	rulebook: { edition: number };
	causes: Cause[];
	nextQuestions: Question[];
	tests: Test[];
	matched: { key: string; value: Value; from: string; score: number }[];
	cautions: string[];
	advice?: { stop: boolean; reason: string; bestTest: string | null };
};

/** Reads an answer as a person says it: "Yes", "-15 degC", an enum's label. */
export function labelValue(observation: PageObservation | undefined, value: Value): string {
	if (typeof value === 'boolean') return value ? 'Yes' : 'No';
	if (typeof value === 'number') return `${value} ${observation?.unit ?? ''}`.trim();
	return observation?.valueLabels[value] ?? value.replaceAll('_', ' ');
}
