// Accepting an invitation: the invited person sets a name and password and is signed in.
import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { acceptInvite, findUsableInvite } from '$lib/server/auth/invites';
import { createUserSession } from '$lib/server/auth/session';
import { ROLE_LABELS } from '$lib/server/auth/roles';
import { failForm, failFromError, nameField, parseForm, passwordField } from '$lib/server/forms';
import type { Action, Actions, PageServerLoad } from './$types';

const EXPIRED =
	'This invitation link has expired or was already used. Ask your manager for a new one.';

export const load: PageServerLoad = async ({ params }) => {
	const row = await findUsableInvite(params.token);
	if (!row) error(404, { message: EXPIRED });
	return {
		email: row.invite.email,
		shopName: row.shopName,
		roleLabel: ROLE_LABELS[row.invite.role]
	};
};

const acceptSchema = z.object({ name: nameField('your name'), password: passwordField });

const acceptAction: Action = async (event) => {
	const parsed = parseForm(acceptSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	let userId: string;
	try {
		({ id: userId } = await acceptInvite(event.params.token, parsed.data));
	} catch (err) {
		return failFromError(err, { name: parsed.data.name });
	}
	const { cookie } = await createUserSession(userId);
	event.cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
	redirect(303, '/');
};

export const actions = { default: acceptAction } satisfies Actions;
