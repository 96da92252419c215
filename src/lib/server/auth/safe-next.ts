/** Where to send a person after signing in: a path of this site, or the home page. */

const MAX_NEXT_LENGTH = 2048;
/** Control characters, spaces and backslashes: URL parsers and browsers drop or reinterpret them. */
// eslint-disable-next-line no-control-regex -- refusing control characters is the point
const UNSAFE_CHARACTERS = /[\u0000-\u0020\u007f-\u009f\\]/;

/**
 * Accepts only a relative path of this site (`/cases?open=1`) and returns it in its normalised,
 * percent-encoded form, which is always a valid header value; anything else gives `/`. The path
 * is parsed against the site's own origin, and the result must stay on that origin.
 */
export function safeNextPath(next: unknown, origin: string): string {
	if (typeof next !== 'string' || next.length === 0 || next.length > MAX_NEXT_LENGTH) return '/';
	if (!next.startsWith('/') || next.startsWith('//') || UNSAFE_CHARACTERS.test(next)) return '/';
	let url: URL;
	let base: URL;
	try {
		base = new URL(origin);
		url = new URL(next, base);
	} catch {
		return '/';
	}
	if (url.origin !== base.origin) return '/';
	const path = url.pathname + url.search + url.hash;
	// The normalised form must itself read as a path of this site.
	if (!path.startsWith('/') || path.startsWith('//')) return '/';
	return path;
}
