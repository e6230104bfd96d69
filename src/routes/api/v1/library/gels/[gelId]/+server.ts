import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, ApiError, idParam } from '$lib/server/api';
import { canSite } from '$lib/server/authz';
import { readCustomGel, removeCustomGel } from '$lib/server/services/library';

/** One shared custom filter with its characterisation (public). */
export const GET = apiRoute(async (event) => json(await readCustomGel(null, idParam(event.params.gelId, 'custom filter'))));

/** Removes a shared custom filter. Site admins only. */
export const DELETE = apiRoute(async (event) => {
	const user = await apiUser(event);
	if (!canSite(user, 'library.manage')) throw new ApiError(403, 'forbidden', 'Only a site admin can change the shared library.');
	await removeCustomGel(null, user.id, idParam(event.params.gelId, 'custom filter'));
	return new Response(null, { status: 204 });
});
