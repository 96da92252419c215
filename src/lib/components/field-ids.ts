// The ids a form control and its hint and error share, so the control describes itself by them.
export function fieldIds(
	id: string | null | undefined,
	name: string,
	hint?: string,
	error?: string | null
) {
	const fieldId = id ?? `field-${name}`;
	const describedBy =
		[hint ? `${fieldId}-hint` : null, error ? `${fieldId}-error` : null]
			.filter(Boolean)
			.join(' ') || undefined;
	return { fieldId, describedBy };
}
