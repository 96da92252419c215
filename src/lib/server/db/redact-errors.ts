/** Keeps query parameters (session hashes, complaints, e-mail addresses) out of logged database errors. */
import { DrizzleQueryError } from 'drizzle-orm/errors';

/**
 * drizzle's `DrizzleQueryError` puts every parameter into its message, stack and an enumerable
 * `params` field, and the server logs errors whole. Its constructor assigns `this.params`; the
 * setter below takes that assignment, keeps the values on a hidden field (for a debugger) and
 * replaces them in the message with their count, before the stack is captured from it.
 * `tests/integration/db-errors.spec.ts` proves that no value reaches a log.
 */
export function redactQueryParameters() {
	const prototype = DrizzleQueryError.prototype;
	if (Object.getOwnPropertyDescriptor(prototype, 'params')) return;
	Object.defineProperty(prototype, 'params', {
		configurable: true,
		get: () => undefined,
		set(this: Error, params: unknown[]) {
			Object.defineProperty(this, 'params', { value: params, enumerable: false, writable: true });
			const count = Array.isArray(params) ? params.length : 0;
			this.message = this.message.replace(
				/\nparams: [\s\S]*$/,
				`\nparams: ${count} value(s), left out of logs`
			);
		}
	});
}
