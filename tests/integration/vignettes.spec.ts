import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_API_KEY, newClient } from './helpers';

type Vignette = {
	id: string;
	rationale: string;
	source: string;
	observations: Record<string, unknown>;
	unknown?: string[];
	complaint?: string;
	expected: string;
	acceptable?: string[];
};

/**
 * Presentations written from trade knowledge and reference.md, each with its rationale and source,
 * run through the public API as an intake form would send them.
 */
const { cases } = JSON.parse(readFileSync('tests/vignettes/cases.json', 'utf8')) as {
	cases: Vignette[];
};
const outcomes: { id: string; rank: number; top1: boolean }[] = [];

describe('vignettes through POST /api/v1/diagnose', () => {
	it('has at least 40 vignettes, each with a rationale and a source', () => {
		expect(cases.length).toBeGreaterThanOrEqual(40);
		for (const c of cases) {
			expect(c.rationale.length, c.id).toBeGreaterThan(10);
			expect(c.source.length, c.id).toBeGreaterThan(3);
		}
	});

	for (const vignette of cases) {
		it(`${vignette.id}: ${vignette.expected} ranks in the top three`, async () => {
			const res = await newClient().json(
				'/api/v1/diagnose',
				{
					observations: vignette.observations,
					unknown: vignette.unknown,
					complaint: vignette.complaint
				},
				{ authorization: `Bearer ${DEMO_API_KEY}` }
			);
			expect(res.status).toBe(200);
			const keys: string[] = res.body.causes.map((c: { key: string }) => c.key);
			const right = new Set([vignette.expected, ...(vignette.acceptable ?? [])]);
			const rank = keys.findIndex((k) => right.has(k)) + 1;
			outcomes.push({ id: vignette.id, rank, top1: rank === 1 });
			expect(rank).toBeGreaterThan(0);
			expect(rank).toBeLessThanOrEqual(3);
		});
	}

	afterAll(() => {
		const top1 = outcomes.filter((o) => o.rank === 1).length;
		const top3 = outcomes.filter((o) => o.rank >= 1 && o.rank <= 3).length;
		console.log(
			`vignettes: top-1 ${top1}/${outcomes.length} (${((100 * top1) / outcomes.length).toFixed(1)} %), ` +
				`top-3 ${top3}/${outcomes.length} (${((100 * top3) / outcomes.length).toFixed(1)} %)`
		);
		for (const o of outcomes.filter((o) => o.rank !== 1))
			console.log(`  not first: ${o.id} (rank ${o.rank})`);
	});
});
