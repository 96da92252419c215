// Search of an edition's observations by what a technician types (fuse.js over prompts and phrases).
import Fuse from 'fuse.js';
import type { Observation, Rulebook } from './schema';

export interface ObservationSearch {
	/** Observations best first; at most `limit` (default 10, at most 50). */
	search(query: string, limit?: number): Observation[];
}

/** Longest query searched; the rest is ignored. */
const MAX_QUERY_CHARS = 200;
const MAX_RESULTS = 50;

/** Built once per edition: fuse.js over each observation's key, prompt and phrases. */
export function createObservationSearch(rulebook: Rulebook): ObservationSearch {
	const fuse = new Fuse(
		rulebook.observations.map((observation) => ({
			observation,
			key: observation.key.replaceAll('_', ' '),
			prompt: observation.prompt,
			phrases: observation.phrases.map((phrase) => phrase.text)
		})),
		{
			keys: [
				{ name: 'prompt', weight: 2 },
				{ name: 'key', weight: 1 },
				{ name: 'phrases', weight: 1 }
			],
			ignoreLocation: true,
			threshold: 0.35
		}
	);
	return {
		search(query, limit = 10) {
			const text = query.trim().slice(0, MAX_QUERY_CHARS);
			if (!text) return [];
			const count = Math.max(1, Math.min(MAX_RESULTS, Math.floor(limit)));
			return fuse.search(text, { limit: count }).map((result) => result.item.observation);
		}
	};
}
