/** Refuses a form post that no action could read, before any action runs: a clear 4xx, never a 500. */
import { error, type Handle } from '@sveltejs/kit';
import { mediaType } from './http';

/** What `request.formData()` can parse; SvelteKit also lets `text/plain` through to an action. */
const READABLE_FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data'];

type Refusal = { status: number; message: string };

/** The action named in the URL, as SvelteKit picks it (the first parameter that starts with `/`). */
function namedAction(url: URL): string | null {
	for (const [name] of url.searchParams) if (name.startsWith('/')) return name.slice(1);
	return null;
}

/** Why no action can read this post, or null when one may. */
async function refusalOf(request: Request, url: URL): Promise<Refusal | null> {
	// SvelteKit throws (a 500) on an explicit `?/default`; it answers any other missing name 404.
	if (namedAction(url) === 'default') {
		return { status: 404, message: 'This page has no form action named "default".' };
	}
	const type = mediaType(request);
	if (!READABLE_FORM_TYPES.includes(type)) {
		return {
			status: 415,
			message: 'Send the form as application/x-www-form-urlencoded or multipart/form-data.'
		};
	}
	if (type !== 'multipart/form-data') return null; // a urlencoded body always parses
	try {
		await request.clone().formData();
		return null;
	} catch (err) {
		if (statusOf(err) === 413) return { status: 413, message: 'The form is too large to send.' };
		return {
			status: 400,
			message: 'The form could not be read; reload the page and send it again.'
		};
	}
}

/** The status of a body-stream failure (the server's body limit is a 413), if it carries one. */
function statusOf(err: unknown): number | undefined {
	const withStatus = (value: unknown) => (value as { status?: unknown } | null)?.status;
	const status = withStatus(err) ?? withStatus((err as { cause?: unknown } | null)?.cause);
	return typeof status === 'number' ? status : undefined;
}

/**
 * Form actions read their body with `request.formData()`, which throws on a broken multipart body
 * or a `text/plain` one, and SvelteKit throws on a post to `?/default` of a page with named
 * actions: each was a 500. Here they are refused first, in the action protocol's own error answer
 * for an enhanced form (`{ type: 'error' }`) and as a plain error page for a browser's own post.
 */
export const refuseUnreadableForms: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (request.method !== 'POST' || url.pathname.startsWith('/api/') || event.route.id === null) {
		return resolve(event);
	}
	const refusal = await refusalOf(request, url);
	if (!refusal) return resolve(event);
	if ((request.headers.get('accept') ?? '').includes('application/json')) {
		const body = { type: 'error', error: { message: refusal.message } };
		return new Response(JSON.stringify(body), {
			status: refusal.status,
			headers: { 'content-type': 'application/json', 'cache-control': 'no-store' }
		});
	}
	error(refusal.status, refusal.message);
};
