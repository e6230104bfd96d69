/**
 * The JSON API's plumbing: who is calling (session cookie or personal access token), and errors as
 * `{ error: { code, message, details } }` with the right status. Bad input is never a 500.
 */
import { isHttpError, json, type RequestEvent } from '@sveltejs/kit';
import { ZodError, type ZodType } from 'zod';
import * as apiTokens from '$lib/server/db/api-tokens';
import * as users from '$lib/server/db/users';
import type { SessionUser } from '$lib/server/auth/types';

export class ApiError extends Error {
	constructor(
		readonly status: number,
		readonly code: string,
		message: string,
		readonly details?: unknown
	) {
		super(message);
	}
}

const CODES: Record<number, string> = {
	400: 'bad_request',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	409: 'conflict',
	413: 'too_large',
	415: 'unsupported_media_type',
	422: 'unprocessable'
};

export function errorResponse(status: number, code: string, message: string, details?: unknown): Response {
	return json({ error: { code, message, ...(details === undefined ? {} : { details }) } }, { status });
}

/** Wraps a handler so every expected failure becomes our JSON error shape. */
export function apiRoute<E extends RequestEvent>(handler: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await handler(event);
		} catch (e) {
			if (e instanceof ApiError) return errorResponse(e.status, e.code, e.message, e.details);
			if (e instanceof ZodError) {
				return errorResponse(400, 'invalid', 'Some fields are not valid.', e.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
			}
			if (isHttpError(e)) {
				const body = e.body as { message?: string; code?: string };
				return errorResponse(e.status, body.code ?? CODES[e.status] ?? 'error', body.message ?? 'Request failed.');
			}
			throw e;
		}
	};
}

/**
 * The caller: the signed-in user (session cookie), or the owner of a personal access token sent
 * as `Authorization: Bearer cs_…`. 401 otherwise.
 */
export async function apiUser(event: RequestEvent): Promise<SessionUser> {
	if (event.locals.user) return event.locals.user;
	const header = event.request.headers.get('authorization');
	const m = header?.match(/^Bearer\s+(\S+)$/i);
	if (m) {
		const userId = await apiTokens.verify(m[1]);
		const user = userId === null ? null : await users.read(userId);
		if (user) return { id: user.id, email: user.email, name: user.name, isAdmin: user.isAdmin };
		throw new ApiError(401, 'invalid_token', 'That access token is not valid (unknown, revoked or expired).');
	}
	throw new ApiError(401, 'unauthenticated', 'Sign in, or send a personal access token as "Authorization: Bearer …".');
}

/** Parses a JSON body against a schema; 415 for another content type, 400 for broken JSON. */
export async function jsonBody<T>(request: Request, schema: ZodType<T>): Promise<T> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.includes('application/json')) throw new ApiError(415, 'unsupported_media_type', 'Send the body as application/json.');
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		throw new ApiError(400, 'invalid_json', 'The body is not valid JSON.');
	}
	return schema.parse(body);
}

/** A positive integer id from the URL, or 404. */
export function idParam(raw: string | undefined, what = 'item'): number {
	if (!raw || !/^[1-9][0-9]{0,9}$/.test(raw)) throw new ApiError(404, 'not_found', `There is no such ${what}.`);
	return Number(raw);
}
