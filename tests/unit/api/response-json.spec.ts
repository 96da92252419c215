import { describe, expect, it } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import { loadRulebookFromDir } from '../../../src/lib/diagnosis/load';
import { createResponseSerializer, toAsciiJson } from '../../../src/lib/api/response-json';
import { diagnose, createRng, makeRandomFacts } from '../diagnosis/factories';

const rulebook = loadRulebookFromDir('rules');
const diagnoser = createDiagnoser(rulebook);
const COMPLAINTS = [
	'gets hot sitting in traffic, fine on the motorway',
	'losing coolant but no drips under the car, sweet smell inside – “ça chauffe” 🔥',
	'white smoke from the exhaust on cold mornings and the heater blows cold',
	undefined
];
const ASCII_ONLY = /^[\x20-\x7e]*$/;

describe('the response serializer', () => {
	it('writes ASCII JSON that reads back as the response, keys in order, request after request', async () => {
		// One serializer for every request, as for an edition on the server, so templates made on
		// one answer set are reused on the others.
		const serializer = createResponseSerializer();
		const rng = createRng(20261202);
		for (let run = 0; run < 300; run++) {
			const observations = makeRandomFacts(rulebook, rng, rng() * 0.6);
			const diagnosis = await diagnose(
				diagnoser,
				{ observations, complaint: COMPLAINTS[run % COMPLAINTS.length] },
				{ questionLimit: run % 3 === 0 ? undefined : 10, testSteps: run % 2 === 0 }
			);
			const response = {
				rulebook: { edition: 1 + (run % 4), publishedAt: run % 5 ? null : '2026-12-02T04:00:00Z' },
				...diagnosis,
				caseId: run % 7 ? null : `case-${run}`
			};
			const text = serializer.stringify(response);
			expect(text).toMatch(ASCII_ONLY);
			// Same value and same key order: re-serialised, it is JSON.stringify's text exactly.
			expect(JSON.stringify(JSON.parse(text))).toBe(JSON.stringify(response));
		}
	});

	it('escapes every non-ASCII character, astral ones as surrogate pairs', () => {
		const value = { note: '92 °C – customer’s 🔥', plain: 'ok' };
		const text = toAsciiJson(value);
		expect(text).toBe(
			'{"note":"92 \\u00b0C \\u2013 customer\\u2019s \\ud83d\\udd25","plain":"ok"}'
		);
		expect(JSON.parse(text)).toEqual(value);
	});

	it('leaves out undefined fields and writes any other value as JSON.stringify does', () => {
		const serializer = createResponseSerializer();
		const response = { a: 1, skipped: undefined, causes: [], nested: { x: [1, 'two'] } };
		expect(serializer.stringify(response)).toBe(JSON.stringify(response));
		expect(serializer.stringify({})).toBe('{}');
	});
});
