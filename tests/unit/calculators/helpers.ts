import { expect } from 'vitest';
import { CalculatorError } from '../../../src/lib/calculators';

/** Runs `fn` and checks it threw a CalculatorError with this message (and field), not a number. */
export function expectCalculatorError(
	fn: () => unknown,
	message: string | RegExp,
	path?: string
): CalculatorError {
	let caught: unknown;
	let returned: unknown;
	try {
		returned = fn();
	} catch (error) {
		caught = error;
	}
	expect(returned, 'returned a value instead of throwing').toBeUndefined();
	expect(caught).toBeInstanceOf(CalculatorError);
	const error = caught as CalculatorError;
	if (typeof message === 'string') expect(error.message).toBe(message);
	else expect(error.message).toMatch(message);
	if (path !== undefined) expect(error.path).toBe(path);
	return error;
}
