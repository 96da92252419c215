// Password reset request: mails a link, rate-limited, answering alike whether the account exists.
import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { startPasswordReset } from '$lib/server/auth/password-reset';
import { hitRateLimits } from '$lib/server/auth/form-rate-limit';
import { emailField, failForm, parseForm } from '$lib/server/forms';
import { clientIp } from '$lib/server/http';
import { getConfig } from '$lib/server/config';
import type { Action, Actions } from './$types';

const requestSchema = z.object({ email: emailField });

const requestAction: Action = async (event) => {
	const parsed = parseForm(requestSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	const { email } = parsed.data;
	// Per address and per account: each request may send an e-mail. Unknown accounts count too,
	// so the limit says nothing about which addresses have accounts.
	const limit = await hitRateLimits(
		[
			{ key: `reset:ip:${clientIp(event)}`, limit: 10 },
			{ key: `reset:account:${email}`, limit: 5 }
		],
		3600
	);
	if (!limit.allowed) {
		event.setHeaders({ 'retry-after': String(limit.retryAfterS) });
		return fail(429, { message: 'Too many reset requests. Try again later.' });
	}
	// The same answer, in the same time, whether or not the address has an account.
	startPasswordReset(email, getConfig().ORIGIN ?? event.url.origin, clientIp(event));
	return { sent: true, email };
};

export const actions = { default: requestAction } satisfies Actions;
