// The rulebook page: the shop's editions and the published one's causes, rules and tests.
import { getPublishedEdition, listEditions } from '$lib/server/editions';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'rulebook:view');
	const [editions, published] = await Promise.all([
		listEditions(user.shopId),
		getPublishedEdition(user.shopId)
	]);
	const { rulebook } = published;
	return {
		editions,
		published: {
			number: published.number,
			causes: rulebook.causes.map((c) => ({
				key: c.key,
				name: c.name,
				prior: c.prior,
				rules: rulebook.rules.filter((r) => r.cause === c.key).length
			})),
			rules: rulebook.rules.map((r) => ({
				key: r.key,
				cause: r.cause,
				lr: r.lr,
				rationale: r.rationale,
				source: r.source
			})),
			observationCount: rulebook.observations.length,
			tests: rulebook.tests.map((t) => ({ key: t.key, name: t.name, minutes: t.minutes }))
		}
	};
};
