/**
 * Calls page form actions and loads directly, as SvelteKit would, with a chosen signed-in user.
 * Every outcome comes back as `{ status, data, location }`: 200 for a returned value, the
 * failure's status for `fail(…)`, 303 with `location` for a redirect, the error's status for `error(…)`.
 */
import { isActionFailure, isHttpError, isRedirect } from '@sveltejs/kit';
import type { SessionUser } from '../../../src/lib/server/auth/types';

export interface Outcome {
	status: number;
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	data: any;
	location?: string;
}

function event(path: string, o: { params: Record<string, string>; user: SessionUser | null; body?: FormData; method?: string }) {
	const url = new URL(path, 'http://127.0.0.1');
	return {
		request: new Request(url, { method: o.method ?? (o.body ? 'POST' : 'GET'), body: o.body }),
		url,
		params: o.params,
		locals: { user: o.user, theme: 'dark' },
		cookies: { get: () => undefined, getAll: () => [], set() {}, delete() {}, serialize: () => '' },
		fetch,
		getClientAddress: () => '127.0.0.1',
		platform: undefined,
		route: { id: path },
		setHeaders() {},
		isDataRequest: false,
		isSubRequest: false,
		parent: async () => ({}),
		depends() {},
		untrack: <T>(fn: () => T) => fn()
	};
}

async function outcome(run: () => unknown): Promise<Outcome> {
	try {
		const r = await run();
		if (isActionFailure(r)) return { status: r.status, data: r.data };
		return { status: 200, data: r };
	} catch (e) {
		if (isRedirect(e)) return { status: e.status, data: null, location: e.location };
		if (isHttpError(e)) return { status: e.status, data: e.body };
		throw e;
	}
}

export function formData(fields: Record<string, string | number | File>): FormData {
	const f = new FormData();
	for (const [k, v] of Object.entries(fields)) f.set(k, v instanceof File ? v : String(v));
	return f;
}

type Actions = Record<string, (e: never) => unknown>;

/** Runs `actions[name]` with the fields as a submitted form. */
export function act(actions: Actions, name: string, path: string, o: { params: Record<string, string>; user: SessionUser | null; form?: Record<string, string | number | File> }): Promise<Outcome> {
	const e = event(`${path}?/${name}`, { params: o.params, user: o.user, body: formData(o.form ?? {}) });
	return outcome(() => (actions[name] as (e: unknown) => unknown)(e));
}

/** Runs a page's server load. */
export function load(fn: (e: never) => unknown, path: string, o: { params: Record<string, string>; user: SessionUser | null }): Promise<Outcome> {
	const e = event(path, { params: o.params, user: o.user });
	return outcome(() => (fn as (e: unknown) => unknown)(e));
}

/** Runs a `+server.ts` GET that uses `projectAccess` (page-style auth). */
export async function get(fn: (e: never) => unknown, path: string, o: { params: Record<string, string>; user: SessionUser | null }): Promise<Outcome & { response?: Response }> {
	const e = event(path, { params: o.params, user: o.user });
	try {
		const r = (await (fn as (e: unknown) => Promise<Response>)(e)) as Response;
		return { status: r.status, data: null, response: r };
	} catch (err) {
		if (isRedirect(err)) return { status: err.status, data: null, location: err.location };
		if (isHttpError(err)) return { status: err.status, data: err.body };
		throw err;
	}
}
