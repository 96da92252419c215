// The intake thank-you page.
import { error } from '@sveltejs/kit';
import { findIntakeShop } from '$lib/server/cases/intake';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const shop = await findIntakeShop(params.shop);
	if (!shop) error(404, { message: 'There is no intake form at this address.' });
	return { shopName: shop.name };
};
