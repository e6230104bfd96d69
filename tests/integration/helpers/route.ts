/**
 * Calls a SvelteKit `+server.ts` handler directly, as the framework would, with a chosen signed-in
 * user (or none) and optional headers. Responses come back as they are.
 */
import type { SessionUser } from '../../../src/lib/server/auth/types';

type Handler = (event: never) => Promise<Response> | Response;

export interface CallOptions {
	params?: Record<string, string>;
	query?: Record<string, string | number>;
	user?: SessionUser | null;
	json?: unknown;
	body?: BodyInit;
	headers?: Record<string, string>;
	method?: string;
}

export async function call(handler: Handler, path: string, o: CallOptions = {}): Promise<Response> {
	const url = new URL(path, 'http://127.0.0.1');
	for (const [k, v] of Object.entries(o.query ?? {})) url.searchParams.set(k, String(v));
	const headers = new Headers(o.headers);
	let body = o.body;
	if (o.json !== undefined) {
		body = JSON.stringify(o.json);
		if (!headers.has('content-type')) headers.set('content-type', 'application/json');
	}
	const request = new Request(url, { method: o.method ?? (body !== undefined ? 'POST' : 'GET'), headers, body });
	const event = {
		request,
		url,
		params: o.params ?? {},
		locals: { user: o.user ?? null, theme: 'dark' },
		cookies: { get: () => undefined, getAll: () => [], set() {}, delete() {}, serialize: () => '' },
		fetch,
		getClientAddress: () => '127.0.0.1',
		platform: undefined,
		route: { id: path },
		setHeaders() {},
		isDataRequest: false,
		isSubRequest: false
	};
	return (handler as (e: typeof event) => Promise<Response>)(event);
}

export function multipart(fields: Record<string, string | { name: string; bytes: Uint8Array | string; type?: string }>): FormData {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) {
		if (typeof v === 'string') form.set(k, v);
		else form.set(k, new File([typeof v.bytes === 'string' ? v.bytes : new Uint8Array(v.bytes)], v.name, { type: v.type ?? 'text/csv' }));
	}
	return form;
}
