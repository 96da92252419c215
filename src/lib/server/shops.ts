/** The shop: its record and its settings. */
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { db } from './db';
import { shops, type ShopSettings } from './db/schema';
import { auditInsert } from './audit';
import { AppError } from './errors';

/** Coolant change intervals: common practice, no source (reference.md: long-life coolant). */
export const DEFAULT_COOLANT_INTERVALS = {
	firstChangeKm: 160_000,
	thenEveryKm: 80_000,
	everyMonths: 60
};

export const shopSettingsSchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Enter the shop name.')
		.max(120, 'Keep the name under 120 characters.'),
	firstChangeKm: z.coerce
		.number({ error: 'Enter a distance in km.' })
		.int('Use whole kilometres.')
		.min(1_000, 'At least 1,000 km.')
		.max(1_000_000, 'At most 1,000,000 km.'),
	thenEveryKm: z.coerce
		.number({ error: 'Enter a distance in km.' })
		.int('Use whole kilometres.')
		.min(1_000, 'At least 1,000 km.')
		.max(1_000_000, 'At most 1,000,000 km.'),
	everyMonths: z.coerce
		.number({ error: 'Enter a number of months.' })
		.int('Use whole months.')
		.min(1, 'At least 1 month.')
		.max(240, 'At most 240 months.')
});

export async function getShop(shopId: string) {
	const [shop] = await db.select().from(shops).where(eq(shops.id, shopId));
	if (!shop) throw new AppError('not_found', 'No such shop.');
	return shop;
}

export function coolantIntervals(settings: ShopSettings) {
	return { ...DEFAULT_COOLANT_INTERVALS, ...settings.coolant };
}

export async function updateShopSettings(
	actor: { id: string; shopId: string },
	input: z.infer<typeof shopSettingsSchema>,
	ip?: string
) {
	const { name, ...coolant } = input;
	await db.batch([
		db.update(shops).set({ name, settings: { coolant } }).where(eq(shops.id, actor.shopId)),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'shop.settings_changed',
			detail: { name, ...coolant },
			ip
		})
	]);
}
