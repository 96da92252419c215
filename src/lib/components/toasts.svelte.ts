// Toasts: short confirmations after an action, shown by <Toasts /> in the app layout.
export type Toast = { id: number; message: string; kind: 'ok' | 'error' };

let nextId = 1;

/** Short confirmations after an action; read by <Toasts /> in the app layout. */
export const toasts = $state<Toast[]>([]);

export function showToast(message: string, kind: Toast['kind'] = 'ok', timeoutMs = 5000) {
	const id = nextId++;
	toasts.push({ id, message, kind });
	setTimeout(() => dismissToast(id), timeoutMs);
}

export function dismissToast(id: number) {
	const index = toasts.findIndex((t) => t.id === id);
	if (index >= 0) toasts.splice(index, 1);
}
