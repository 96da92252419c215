// Roles and permissions: what each role may do, and which roles a person may hand out.
import { ROLES, type Role } from '../db/schema';

export { ROLES, type Role };

/**
 * What each role may do (design.md, "Users and roles"). The admin, first user of a new shop,
 * may do everything so that a one-person shop is never locked out of a capability.
 */
const PERMISSIONS = {
	'diagnose:use': ['technician', 'lead', 'manager', 'admin'],
	'calculators:use': ['technician', 'lead', 'manager', 'admin'],
	'cases:work': ['technician', 'lead', 'admin'],
	'cases:read': ['technician', 'lead', 'manager', 'admin'],
	'rulebook:view': ['lead', 'manager', 'admin'],
	'rulebook:edit': ['lead', 'admin'],
	'casebook:review': ['manager', 'admin'],
	'users:manage': ['manager', 'admin'],
	'apikeys:manage': ['manager', 'admin'],
	'audit:view': ['manager', 'admin'],
	'shop:settings': ['admin']
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
	return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export const ROLE_LABELS: Record<Role, string> = {
	technician: 'Technician',
	lead: 'Lead technician',
	manager: 'Service manager',
	admin: 'Shop admin'
};

/** Managers may hand out any role but admin; only an admin makes another admin. */
export function assignableRoles(actor: Role): Role[] {
	return actor === 'admin' ? [...ROLES] : ROLES.filter((r) => r !== 'admin');
}
