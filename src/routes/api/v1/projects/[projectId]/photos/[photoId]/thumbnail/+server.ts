import { apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { GET_URL_SECONDS, photoObjectUrl } from '$lib/server/services/photos';

/** After the permission check, 303 to a presigned GET of the thumbnail that lasts GET_URL_SECONDS. */
export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'project.view');
	const url = await photoObjectUrl(access, idParam(event.params.photoId, 'photo'), 'thumbnail');
	// The browser may reuse the redirect for half the URL's lifetime, never past it.
	return new Response(null, { status: 303, headers: { location: url, 'cache-control': `private, max-age=${Math.floor(GET_URL_SECONDS / 2)}` } });
});
