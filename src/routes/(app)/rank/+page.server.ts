// The rank page's data: the published edition's observations and test steps.
import { getPublishedEdition } from '$lib/server/editions';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'diagnose:use');
	const edition = await getPublishedEdition(user.shopId);
	return {
		edition: edition.number,
		testSteps: Object.fromEntries(edition.rulebook.tests.map((t) => [t.key, t.steps])),
		observations: edition.rulebook.observations.map((o) => ({
			key: o.key,
			prompt: o.prompt,
			kind: o.kind,
			values: o.kind === 'enum' ? o.values : o.kind === 'boolean' ? [true, false] : [],
			valueLabels: ('valueLabels' in o ? o.valueLabels : undefined) ?? {},
			unit: o.kind === 'number' ? o.unit : undefined,
			min: o.kind === 'number' ? o.min : undefined,
			max: o.kind === 'number' ? o.max : undefined,
			cautions: o.cautions ?? []
		}))
	};
};
