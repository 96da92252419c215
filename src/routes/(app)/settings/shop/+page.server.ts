// Shop settings: the shop's name and coolant service interval.
import { getShop } from '$lib/server/shops';
import { failForm, parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import { clientIp } from '$lib/server/http';
import { coolantIntervals, shopSettingsSchema, updateShopSettings } from '$lib/server/shops';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'shop:settings');
	const shop = await getShop(user.shopId);
	return { name: shop.name, intervals: coolantIntervals(shop.settings) };
};

const saveAction: Action = async (event) => {
	const user = requirePermission(event, 'shop:settings');
	const parsed = parseForm(shopSettingsSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors, parsed.values);
	await updateShopSettings(user, parsed.data, clientIp(event));
	return { ok: true, notice: 'Shop settings saved.' };
};

export const actions = { save: saveAction } satisfies Actions;
