import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { ApiError, apiRoute, jsonBody } from '$lib/server/api';
import * as apiTokens from '$lib/server/db/api-tokens';

// Tokens are managed with a signed-in session only: a token cannot mint more tokens.
function sessionUser(locals: App.Locals) {
	if (!locals.user) throw new ApiError(401, 'unauthenticated', 'Sign in to manage access tokens.');
	return locals.user;
}

export const GET = apiRoute(async ({ locals }) => json({ items: await apiTokens.list(sessionUser(locals).id) }));

export const POST = apiRoute(async ({ locals, request }) => {
	const user = sessionUser(locals);
	const { name, expiresInDays } = await jsonBody(
		request,
		z.object({ name: z.string().trim().min(1).max(120), expiresInDays: z.number().int().min(1).max(3650).nullish() })
	);
	const expires = expiresInDays ? new Date(Date.now() + expiresInDays * 86_400_000) : null;
	const { token, record } = await apiTokens.create(user.id, name, expires);
	return json({ token, ...record, note: 'Keep this token now: it is not shown again.' }, { status: 201 });
});
