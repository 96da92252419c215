// Password reset: a new password from a valid reset link.
import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { findUsableReset, resetPassword } from '$lib/server/auth/password-reset';
import { failForm, failFromError, parseForm, passwordField } from '$lib/server/forms';
import { clientIp } from '$lib/server/http';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const row = await findUsableReset(params.token);
	if (!row)
		error(404, { message: 'This reset link has expired or was already used. Ask for a new one.' });
	return { email: row.email };
};

const resetSchema = z.object({ password: passwordField });

const resetAction: Action = async (event) => {
	const parsed = parseForm(resetSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	try {
		await resetPassword(event.params.token, parsed.data.password, clientIp(event));
	} catch (err) {
		return failFromError(err);
	}
	redirect(303, '/signin?reset=1');
};

export const actions = { default: resetAction } satisfies Actions;
