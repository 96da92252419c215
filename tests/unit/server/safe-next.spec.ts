import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { safeNextPath } from '../../../src/lib/server/auth/safe-next';

const ORIGIN = 'https://causeway.example';
const RUNS = { seed: 20261202, numRuns: 2000 };

/** Pieces attackers combine: separators browsers drop or swap, encodings, other hosts. */
const hostileFragment = fc.constantFrom(
	'/',
	'//',
	'\\',
	'/\\',
	'\t',
	'\n',
	'\r',
	'\u0000',
	'\u007f',
	'\u0085',
	' ',
	'%09',
	'%0a',
	'%2f',
	'%5c',
	'.',
	'..',
	'@',
	':',
	'evil.example',
	'https:',
	'javascript:',
	'é',
	'\u2028',
	'\ud800',
	'?',
	'#'
);
const hostileNext = fc
	.array(fc.oneof(hostileFragment, fc.string({ unit: 'binary', maxLength: 6 })), { maxLength: 12 })
	.map((parts) => parts.join(''));

/** What the browser would do with the Location header: resolve it against the page. */
const landsOn = (location: string) => new URL(location, `${ORIGIN}/signin`).origin;

describe('safeNextPath', () => {
	it('always answers a same-origin path that is a valid, printable header value', () => {
		fc.assert(
			fc.property(fc.oneof(hostileNext, fc.string({ unit: 'binary' })), (next) => {
				const path = safeNextPath(next, ORIGIN);
				expect(path.startsWith('/')).toBe(true);
				expect(path.startsWith('//')).toBe(false);
				expect(path).toMatch(/^[\x21-\x7e]+$/);
				expect(path).not.toContain('\\');
				expect(landsOn(path)).toBe(ORIGIN);
				expect(() => new Headers({ location: path })).not.toThrow();
			}),
			RUNS
		);
	});

	it('sends any absolute or protocol-relative address of another site home', () => {
		fc.assert(
			fc.property(
				fc.webUrl(),
				fc.constantFrom('/', '/\t/', '/\n/', '/\\', '\\\\', ' /', '/ /'),
				(url, prefix) => {
					const withoutScheme = url.replace(/^[a-z]+:\/\//, '');
					expect(safeNextPath(url, ORIGIN)).toBe('/');
					expect(safeNextPath(prefix + '/' + withoutScheme, ORIGIN)).toBe('/');
				}
			),
			RUNS
		);
	});

	it('keeps an ordinary path of this site as it was', () => {
		const segment = fc.stringMatching(/^[a-z0-9-]{1,12}$/);
		const query = fc.option(fc.stringMatching(/^[a-z]{1,6}=[a-z0-9]{1,6}$/), { nil: undefined });
		fc.assert(
			fc.property(fc.array(segment, { minLength: 1, maxLength: 5 }), query, (segments, q) => {
				const next = '/' + segments.join('/') + (q ? `?${q}` : '');
				expect(safeNextPath(next, ORIGIN)).toBe(next);
			}),
			RUNS
		);
	});

	it('refuses the tab, newline and dot-segment tricks and encodes other letters', () => {
		expect(safeNextPath('/\t/evil.example', ORIGIN)).toBe('/');
		expect(safeNextPath('/\n/evil.example', ORIGIN)).toBe('/');
		expect(safeNextPath('/x\r\nSet-Cookie: a=b', ORIGIN)).toBe('/');
		expect(safeNextPath('/.//evil.example', ORIGIN)).toBe('/');
		expect(safeNextPath('/\\evil.example', ORIGIN)).toBe('/');
		expect(safeNextPath('/cases/%09/x', ORIGIN)).toBe('/cases/%09/x');
		expect(safeNextPath('/cases?q=é', ORIGIN)).toBe('/cases?q=%C3%A9');
		expect(safeNextPath(undefined, ORIGIN)).toBe('/');
		expect(safeNextPath('/' + 'a'.repeat(5000), ORIGIN)).toBe('/');
	});
});
