import { ApiError, apiRoute, idParam } from '$lib/server/api';
import * as apiTokens from '$lib/server/db/api-tokens';

export const DELETE = apiRoute(async ({ locals, params }) => {
	if (!locals.user) throw new ApiError(401, 'unauthenticated', 'Sign in to manage access tokens.');
	const ok = await apiTokens.revoke(locals.user.id, idParam(params.tokenId, 'token'));
	if (!ok) throw new ApiError(404, 'not_found', 'There is no such token.');
	return new Response(null, { status: 204 });
});
