// Sign-up page: a new shop with its first admin.
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { startSignUp } from '$lib/server/auth/signup';
import {
	emailField,
	failForm,
	failFromError,
	nameField,
	parseForm,
	passwordField
} from '$lib/server/forms';
import { hitRateLimit } from '$lib/server/auth/form-rate-limit';
import { clientIp } from '$lib/server/http';
import { getConfig } from '$lib/server/config';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return {};
};

const signUpSchema = z.object({
	shopName: nameField('the shop name'),
	name: nameField('your name'),
	email: emailField,
	password: passwordField
});

const createShopAction: Action = async (event) => {
	const parsed = parseForm(signUpSchema, await event.request.formData());
	if (!parsed.ok) return failForm(parsed.errors);
	const { password, ...values } = parsed.data;
	const limit = await hitRateLimit(
		`signup:ip:${clientIp(event)}`,
		getConfig().SIGNUP_LIMIT_PER_HOUR,
		3600
	);
	if (!limit.allowed) {
		return fail(429, { message: 'Too many new shops from this address. Try again later.', values });
	}
	try {
		startSignUp({ ...values, password }, getConfig().ORIGIN ?? event.url.origin);
	} catch (err) {
		return failFromError(err, values);
	}
	// The same answer whether or not the address has an account: the e-mail says which.
	return { sentTo: values.email };
};

export const actions = { default: createShopAction } satisfies Actions;
