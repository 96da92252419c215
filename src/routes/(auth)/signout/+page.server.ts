// Sign-out: ends the session and returns to the sign-in page.
import { redirect } from '@sveltejs/kit';
import { blankSessionCookie, invalidateSession } from '$lib/server/auth/session';
import type { Action, Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => redirect(303, '/');

const signOutAction: Action = async ({ locals, cookies }) => {
	if (locals.session) await invalidateSession(locals.session);
	const cookie = blankSessionCookie();
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
	redirect(303, '/signin');
};

export const actions = { default: signOutAction } satisfies Actions;
