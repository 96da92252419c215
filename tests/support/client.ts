import { parse } from 'devalue';

/**
 * A tiny HTTP client with a cookie jar, for driving the real server the way a browser does:
 * same-origin form posts (SvelteKit's action protocol) and JSON API calls.
 */
export class Client {
	cookies = new Map<string, string>();
	constructor(readonly baseUrl: string) {}

	private cookieHeader() {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private storeCookies(res: Response) {
		for (const line of res.headers.getSetCookie()) {
			const [pair, ...attrs] = line.split(';');
			const eq = pair.indexOf('=');
			const name = pair.slice(0, eq).trim();
			const value = pair.slice(eq + 1).trim();
			const expired = attrs.some((a) => /max-age=0/i.test(a)) || value === '';
			if (expired) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	async request(path: string, init: RequestInit = {}) {
		const headers = new Headers(init.headers);
		if (this.cookies.size) headers.set('cookie', this.cookieHeader());
		const res = await fetch(this.baseUrl + path, { ...init, headers, redirect: 'manual' });
		this.storeCookies(res);
		return res;
	}

	get(path: string, init: RequestInit = {}) {
		return this.request(path, init);
	}

	/** A form posted the way a browser without JavaScript does (no action protocol): the raw answer. */
	postForm(path: string, fields: Record<string, string>) {
		return this.request(path, {
			method: 'POST',
			headers: {
				origin: this.baseUrl,
				accept: 'text/html',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams(fields).toString()
		});
	}

	/** A form action posted the way `use:enhance` does; returns the action result. */
	async action(path: string, fields: Record<string, string>) {
		const res = await this.request(path, {
			method: 'POST',
			headers: {
				origin: this.baseUrl,
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams(fields).toString()
		});
		const body = (await res.json()) as {
			type: string;
			status?: number;
			location?: string;
			data?: string;
			error?: { message: string };
		};
		const data = body.data ? (parse(body.data) as Record<string, unknown>) : undefined;
		return {
			httpStatus: res.status,
			type: body.type,
			status: body.status ?? res.status,
			location: body.location,
			data,
			error: body.error
		};
	}

	async json(path: string, body: unknown, headers: Record<string, string> = {}) {
		const res = await this.request(path, {
			method: 'POST',
			headers: { 'content-type': 'application/json', ...headers },
			body: typeof body === 'string' ? body : JSON.stringify(body)
		});
		const text = await res.text();
		let parsed: unknown;
		try {
			parsed = JSON.parse(text);
		} catch {
			parsed = text;
		}
		return {
			status: res.status,
			headers: res.headers, // eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read arbitrary JSON
			body: parsed as Record<string, any>
		};
	}

	async signIn(email: string, password: string) {
		const result = await this.action('/signin', { email, password });
		if (result.type !== 'redirect') throw new Error(`sign-in failed: ${JSON.stringify(result)}`);
		return result;
	}
}
