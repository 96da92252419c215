// A form's "sending…" state for use:enhance: on while the post is out, values kept on failure.
import type { SubmitFunction } from '@sveltejs/kit';

export function pendingForm() {
	let pending = $state(false);
	const submit: SubmitFunction = () => {
		pending = true;
		return async ({ update }) => {
			await update({ reset: false });
			pending = false;
		};
	};
	return {
		get pending() {
			return pending;
		},
		submit
	};
}
