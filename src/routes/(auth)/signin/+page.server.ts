// Sign-in page: checks the password, throttled, and returns to where the person was going.
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { safeNextPath } from '$lib/server/auth/safe-next';
import { signIn } from '$lib/server/auth/users';
import { createUserSession } from '$lib/server/auth/session';
import { emailField, failForm, parseForm, passwordField } from '$lib/server/forms';
import { clientIp } from '$lib/server/http';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return {};
};

const signInSchema = z.object({
	email: emailField,
	password: passwordField,
	next: z.string().optional()
});

const signInAction: Action = async (event) => {
	const parsed = parseForm(signInSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	const { email, password, next } = parsed.data;
	const result = await signIn(email, password, clientIp(event));
	if (!result.ok) {
		if (result.reason === 'locked') {
			event.setHeaders({ 'retry-after': String(result.retryAfterS) });
			return fail(429, {
				message: `Too many failed sign-ins. Try again in ${Math.ceil(result.retryAfterS / 60)} minute(s).`,
				values: { email }
			});
		}
		return fail(400, {
			message: 'That e-mail and password do not match an active account.',
			values: { email }
		});
	}
	const { cookie } = await createUserSession(result.user.id);
	event.cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
	redirect(303, safeNextPath(next, event.url.origin));
};

export const actions = { default: signInAction } satisfies Actions;
