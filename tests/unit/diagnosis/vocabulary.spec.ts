import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadRulebookFromDir } from '../../../src/lib/diagnosis/load';

// tests/contract/vocabulary.json is a copy of the API contract's core vocabulary. The rulebook may
// add observations and causes; it may never rename or drop these, nor change their kinds and values.
type Vocabulary = {
	observations: Record<
		string,
		{
			kind: 'boolean' | 'enum' | 'number';
			values?: string[];
			min?: number;
			max?: number;
			unit?: string;
		}
	>;
	causes: Record<string, string>;
};
const vocabulary = JSON.parse(readFileSync('tests/contract/vocabulary.json', 'utf8')) as Vocabulary;
const rulebook = loadRulebookFromDir('rules');

describe('the base rulebook keeps the contract vocabulary', () => {
	it('matches the contract it was copied from, in ../shared beside the checkout', () => {
		const shared = '../shared/contract/vocabulary.json';
		// Without the shared contract there is nothing to compare with: that is a failure, not a pass.
		expect(existsSync(shared), `${shared} is missing: check out shared/ beside the project`).toBe(
			true
		);
		expect(vocabulary).toEqual(JSON.parse(readFileSync(shared, 'utf8')));
	});

	it('has every contract observation with the same kind, values and range', () => {
		const byKey = new Map(rulebook.observations.map((o) => [o.key, o]));
		for (const [key, spec] of Object.entries(vocabulary.observations)) {
			const observation = byKey.get(key);
			expect(observation, key).toBeDefined();
			expect(observation!.kind, key).toBe(spec.kind);
			if (spec.kind === 'enum' && observation!.kind === 'enum') {
				expect(observation!.values, key).toEqual(expect.arrayContaining(spec.values!));
			}
			if (spec.kind === 'number' && observation!.kind === 'number') {
				expect([observation!.min, observation!.max], key).toEqual([spec.min, spec.max]);
			}
		}
	});

	it('has every contract cause', () => {
		const keys = new Set(rulebook.causes.map((c) => c.key));
		for (const key of Object.keys(vocabulary.causes)) expect(keys.has(key), key).toBe(true);
	});
});
