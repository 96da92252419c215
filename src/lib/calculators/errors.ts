/** One problem with a calculator's input: the field it concerns (a dot path) and what to do. */
export interface CalculatorIssue {
	path: string;
	message: string;
}

/**
 * Thrown for any input a calculator cannot answer honestly. The message is written for the
 * person at the bay or the service desk, so an endpoint or a form can show it unchanged.
 */
export class CalculatorError extends Error {
	readonly path: string | undefined;
	readonly issues: CalculatorIssue[];

	constructor(message: string, path?: string, issues?: CalculatorIssue[]) {
		super(message);
		this.name = 'CalculatorError';
		this.path = path;
		this.issues = issues ?? [{ path: path ?? '', message }];
	}
}

/** Throws the first issue (carrying all of them) so a calculator never returns a number for bad input. */
export function throwIfIssues(issues: CalculatorIssue[]): void {
	const first = issues[0];
	if (first) throw new CalculatorError(first.message, first.path || undefined, issues);
}
