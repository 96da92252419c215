// The app layout's data: the signed-in person, the shop and the sections their role may open.
import { can, ROLE_LABELS } from '$lib/server/auth/roles';
import { getShop } from '$lib/server/shops';
import { requireUser } from '$lib/server/guard';
import { NAV } from '$lib/nav';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const user = requireUser(event);
	const shop = await getShop(user.shopId);
	return {
		user: {
			name: user.name,
			email: user.email,
			role: user.role,
			roleLabel: ROLE_LABELS[user.role]
		},
		shopName: shop.name,
		nav: NAV.filter((item) => can(user.role, item.permission)).map(({ href, label }) => ({
			href,
			label
		}))
	};
};
