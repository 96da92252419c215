// API key settings: list, create and revoke the shop's keys.
import { z } from 'zod';
import { createApiKey, listApiKeys, revokeApiKey } from '$lib/server/auth/api-keys';
import { failForm, failFromError, nameField, parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import { clientIp } from '$lib/server/http';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'apikeys:manage');
	return { keys: await listApiKeys(user.shopId) };
};

const createAction: Action = async (event) => {
	const user = requirePermission(event, 'apikeys:manage');
	const parsed = parseForm(
		z.object({ name: nameField('a name for the key') }),
		await event.request.formData()
	);
	if (!parsed.ok) return failForm(parsed.errors);
	const { key } = await createApiKey(user, parsed.data.name, clientIp(event));
	// Returned once in the action result; it is never stored or shown again.
	return { ok: true, createdKey: key, createdName: parsed.data.name };
};

const revokeAction: Action = async (event) => {
	const user = requirePermission(event, 'apikeys:manage');
	const parsed = parseForm(
		z.object({ keyId: z.string().min(1).max(64) }),
		await event.request.formData()
	);
	if (!parsed.ok) return failForm(parsed.errors);
	try {
		await revokeApiKey(user, parsed.data.keyId, clientIp(event));
	} catch (err) {
		return failFromError(err);
	}
	return { ok: true, notice: 'Key revoked. Requests with it are refused from now on.' };
};

export const actions = { create: createAction, revoke: revokeAction } satisfies Actions;
