// The app's sections and the permission each needs.
import type { Permission } from '$lib/server/auth/roles';

/** The app's sections; the layout shows those the signed-in role may open. */
export const NAV: { href: string; label: string; permission: Permission }[] = [
	{ href: '/rank', label: 'Rank causes', permission: 'diagnose:use' },
	{ href: '/calculators', label: 'Calculators', permission: 'calculators:use' },
	{ href: '/rulebook', label: 'Rulebook', permission: 'rulebook:view' },
	{ href: '/settings/users', label: 'Team', permission: 'users:manage' },
	{ href: '/settings/api-keys', label: 'API keys', permission: 'apikeys:manage' },
	{ href: '/settings/audit', label: 'Audit log', permission: 'audit:view' },
	{ href: '/settings/shop', label: 'Shop', permission: 'shop:settings' }
];
