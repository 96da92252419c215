// Users settings: the shop's people, invitations, roles and who is active.
import { z } from 'zod';
import { inviteUser, listPendingInvites, withdrawInvite } from '$lib/server/auth/invites';
import { assignableRoles, ROLE_LABELS, ROLES } from '$lib/server/auth/roles';
import { changeUserRole, listUsers, setUserActive } from '$lib/server/auth/users';
import { getConfig } from '$lib/server/config';
import { emailField, failForm, failFromError, parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import { clientIp } from '$lib/server/http';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'users:manage');
	const [users, invites] = await Promise.all([
		listUsers(user.shopId),
		listPendingInvites(user.shopId)
	]);
	return {
		users,
		invites,
		me: user.id,
		roles: assignableRoles(user.role).map((r) => ({ value: r, label: ROLE_LABELS[r] })),
		roleLabels: ROLE_LABELS
	};
};

const roleField = z.enum(ROLES, { error: 'Choose a role.' });
const userIdField = z.string().min(1).max(64);

const inviteSchema = z.object({ email: emailField, role: roleField });

const inviteAction: Action = async (event) => {
	const user = requirePermission(event, 'users:manage');
	const parsed = parseForm(inviteSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	try {
		await inviteUser(user, parsed.data, getConfig().ORIGIN ?? event.url.origin, clientIp(event));
	} catch (err) {
		return failFromError(err, parsed.data);
	}
	return { ok: true, notice: `Invitation sent to ${parsed.data.email}.` };
};

const withdrawAction: Action = async (event) => {
	const user = requirePermission(event, 'users:manage');
	const parsed = parseForm(z.object({ inviteId: userIdField }), await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	try {
		await withdrawInvite(user, parsed.data.inviteId, clientIp(event));
	} catch (err) {
		return failFromError(err);
	}
	return { ok: true, notice: 'Invitation withdrawn. Its link no longer works.' };
};

const changeRoleAction: Action = async (event) => {
	const user = requirePermission(event, 'users:manage');
	const parsed = parseForm(
		z.object({ userId: userIdField, role: roleField }),
		await event.request.formData()
	);
	if (!parsed.ok) return failForm(parsed.errors);
	try {
		await changeUserRole(user, parsed.data.userId, parsed.data.role, clientIp(event));
	} catch (err) {
		return failFromError(err);
	}
	return { ok: true, notice: 'Role changed. That person has been signed out everywhere.' };
};

const setActiveSchema = z.object({ userId: userIdField, active: z.enum(['true', 'false']) });

const setActiveAction: Action = async (event) => {
	const user = requirePermission(event, 'users:manage');
	const parsed = parseForm(setActiveSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	const active = parsed.data.active === 'true';
	try {
		await setUserActive(user, parsed.data.userId, active, clientIp(event));
	} catch (err) {
		return failFromError(err);
	}
	return { ok: true, notice: active ? 'User reactivated.' : 'User deactivated and signed out.' };
};

export const actions = {
	invite: inviteAction,
	withdrawInvite: withdrawAction,
	changeRole: changeRoleAction,
	setActive: setActiveAction
} satisfies Actions;
