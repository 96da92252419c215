import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requestPasswordReset } from '$lib/server/auth/password-reset';
import { hitRateLimit } from '$lib/server/auth/form-rate-limit';
import { emailField, failForm, parseForm } from '$lib/server/forms';
import { clientIp } from '$lib/server/http';
import { getConfig } from '$lib/server/config';
import type { Action, Actions } from './$types';

const requestSchema = z.object({ email: emailField });

const requestAction: Action = async (event) => {
	const parsed = parseForm(requestSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	const { email } = parsed.data;
	const limit = await hitRateLimit(`reset:ip:${clientIp(event)}`, 10, 3600);
	if (!limit.allowed) {
		return fail(429, { message: 'Too many reset requests from this address. Try again later.' });
	}
	await requestPasswordReset(email, getConfig().ORIGIN ?? event.url.origin, clientIp(event));
	// The same answer whether or not the address has an account.
	return { sent: true, email };
};

export const actions = { default: requestAction } satisfies Actions;
