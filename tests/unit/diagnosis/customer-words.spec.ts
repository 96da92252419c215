import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { createDiagnoser, type ObservationValue } from '../../../src/lib/diagnosis';
import { loadRulebookFromDir } from '../../../src/lib/diagnosis/load';

interface CustomerWording {
	id: string;
	split: 'tune' | 'held_out';
	kinds: string[];
	complaint: string;
	matches: { key: string; value: ObservationValue }[];
	notMatched: { key: string; value?: ObservationValue }[];
	causes: string[];
	/** Expected matches the matcher does not give yet, each with why. */
	knownMisses?: { key: string; value: ObservationValue; why: string }[];
}

// Invented wordings of the invented shop's customers, with what a technician reads from them
// (common practice, no source). The held-out third is measured and never tuned to.
const { cases } = JSON.parse(readFileSync('tests/fixtures/customer-words.json', 'utf8')) as {
	cases: CustomerWording[];
};
const diagnoser = createDiagnoser(loadRulebookFromDir('rules'));
const KINDS = [
	'long',
	'misspelling',
	'negation_scope',
	'doubt',
	'timing',
	'anatomy',
	'colour_texture'
];
/** Held-out top-3 measured when the set was written and matching last changed (14 of 16). */
const MIN_HELD_OUT_TOP3 = 14 / 16;

async function readWording(wording: CustomerWording) {
	const ranking = await diagnoser.rank({ observations: {}, complaint: wording.complaint });
	const keys = ranking.causes.map((cause) => cause.key);
	const rank = keys.findIndex((key) => wording.causes.includes(key)) + 1;
	const found = wording.matches.filter((expected) =>
		ranking.matched.some((m) => m.key === expected.key && m.value === expected.value)
	);
	const wrong = wording.notMatched.filter((unwanted) =>
		ranking.matched.some(
			(m) => m.key === unwanted.key && (unwanted.value === undefined || m.value === unwanted.value)
		)
	);
	return { ranking, rank, found, wrong };
}

describe('customer wordings: the set', () => {
	it('has at least 40 wordings, a third held out, every kind in both parts', () => {
		expect(cases.length).toBeGreaterThanOrEqual(40);
		const heldOut = cases.filter((c) => c.split === 'held_out');
		expect(heldOut.length).toBeGreaterThanOrEqual(Math.floor(cases.length / 3));
		for (const split of ['tune', 'held_out']) {
			const kinds = new Set(cases.filter((c) => c.split === split).flatMap((c) => c.kinds));
			expect([...kinds].sort(), split).toEqual([...KINDS].sort());
		}
	});
});

describe('customer wordings: tuning part', () => {
	for (const wording of cases.filter((c) => c.split === 'tune')) {
		it(`${wording.id} (${wording.kinds.join(', ')}): ${wording.complaint.slice(0, 60)}`, async () => {
			const { ranking, rank, found, wrong } = await readWording(wording);
			const missed = wording.matches.filter((expected) => !found.includes(expected));
			expect(missed, 'expected matches not given').toEqual(
				(wording.knownMisses ?? []).map(({ key, value }) => ({ key, value }))
			);
			expect(wrong, 'readings it must not give').toEqual([]);
			// Each match quotes the customer's own words.
			for (const m of ranking.matched) expect(wording.complaint).toContain(m.from);
			expect(rank, `causes ${ranking.causes.map((c) => c.key).slice(0, 3)}`).toBeGreaterThan(0);
			expect(rank).toBeLessThanOrEqual(3);
		});
	}
});

describe('customer wordings: held-out part (measured, never tuned to)', () => {
	const outcomes: {
		top3: boolean;
		top1: boolean;
		found: number;
		expected: number;
		wrong: number;
	}[] = [];

	it('puts a right cause in the top three for at least 14 of 16 held-out wordings', async () => {
		for (const wording of cases.filter((c) => c.split === 'held_out')) {
			const { ranking, rank, found, wrong } = await readWording(wording);
			for (const m of ranking.matched) expect(wording.complaint).toContain(m.from);
			outcomes.push({
				top3: rank >= 1 && rank <= 3,
				top1: rank === 1,
				found: found.length,
				expected: wording.matches.length,
				wrong: wrong.length
			});
		}
		const top3 = outcomes.filter((o) => o.top3).length / outcomes.length;
		expect(top3).toBeGreaterThanOrEqual(MIN_HELD_OUT_TOP3);
	});

	afterAll(() => {
		const sum = (pick: (o: (typeof outcomes)[number]) => number) =>
			outcomes.reduce((total, o) => total + pick(o), 0);
		console.log(
			`customer wordings held out: top-3 ${sum((o) => +o.top3)}/${outcomes.length}, ` +
				`top-1 ${sum((o) => +o.top1)}/${outcomes.length}, ` +
				`expected matches ${sum((o) => o.found)}/${sum((o) => o.expected)}, ` +
				`readings it must not give ${sum((o) => o.wrong)}`
		);
	});
});
