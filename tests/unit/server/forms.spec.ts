import { describe, expect, it } from 'vitest';
import { stringify } from 'devalue';
import { z } from 'zod';
import { failForm, parseForm } from '../../../src/lib/server/forms';

const schema = z.object({
	name: z.string().min(1, 'Enter the shop name.'),
	months: z.coerce.number()
});

const formOf = (entries: [string, string | Blob][]) => {
	const form = new FormData();
	for (const [key, value] of entries) form.append(key, value);
	return form;
};

describe('reading a form post', () => {
	it('fails a file sent in a text field, and sends back only the text fields', () => {
		const parsed = parseForm(
			schema,
			formOf([
				['name', new Blob(['not a name'])],
				['months', '60']
			])
		);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		expect(Object.keys(parsed.errors)).toEqual(['name']);
		expect(parsed.values).toEqual({ months: '60' });
	});

	it('treats fields named like Object members as plain fields', () => {
		const parsed = parseForm(
			schema,
			formOf([
				['constructor', 'x'],
				['toString', 'y'],
				['__proto__', 'z'],
				['name', 'Saltmarsh Lane Garage'],
				['months', '60']
			])
		);
		expect(parsed).toEqual({ ok: true, data: { name: 'Saltmarsh Lane Garage', months: 60 } });
	});

	it('answers a failed parse with values the form answer can serialise (no __proto__, no file)', () => {
		const parsed = parseForm(
			schema,
			formOf([
				['__proto__', 'z'],
				['name', ''],
				['months', '60']
			])
		);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		const answer = failForm(parsed.errors, { ...parsed.values, upload: new Blob(['x']) });
		expect(answer.status).toBe(400);
		expect(answer.data.values).toEqual({ name: '', months: '60' });
		expect(() => stringify(answer.data)).not.toThrow();
	});
});
