// The e-mailed sign-up link: shows the shop to be created, and creates it on confirmation.
import { error, redirect } from '@sveltejs/kit';
import { completeSignUp, findUsableSignUp } from '$lib/server/auth/signup';
import { createUserSession } from '$lib/server/auth/session';
import { failFromError } from '$lib/server/forms';
import type { Action, Actions, PageServerLoad } from './$types';

const EXPIRED = 'This link has expired or was already used. Set up the shop again, or sign in.';

export const load: PageServerLoad = async ({ params }) => {
	const row = await findUsableSignUp(params.token);
	if (!row) error(404, { message: EXPIRED });
	return { shopName: row.shopName, email: row.email };
};

const confirmAction: Action = async (event) => {
	let userId: string;
	try {
		({ userId } = await completeSignUp(event.params.token));
	} catch (err) {
		return failFromError(err);
	}
	const { cookie } = await createUserSession(userId);
	event.cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
	redirect(303, '/');
};

export const actions = { default: confirmAction } satisfies Actions;
