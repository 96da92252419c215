import { describe, expect, it } from 'vitest';
import { createObservationSearch } from '../../../src/lib/diagnosis/observation-search';
import { makeCoolingRulebook } from './factories';

describe('observation search', () => {
	const search = createObservationSearch(makeCoolingRulebook());

	it('finds the fan observation from a word of its prompt, misspelt', () => {
		expect(search.search('fna').map((observation) => observation.key)).toContain(
			'fan_runs_when_hot'
		);
	});

	it('finds an observation by one of its phrases', () => {
		expect(search.search('windows fog up')[0]?.key).toBe('windscreen_film');
	});

	it('answers nothing for an empty query and keeps to the limit', () => {
		expect(search.search('   ')).toEqual([]);
		expect(search.search('e', 2).length).toBeLessThanOrEqual(2);
	});
});
