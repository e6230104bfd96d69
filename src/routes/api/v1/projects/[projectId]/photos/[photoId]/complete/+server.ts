import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { completeUpload, toApiPhoto } from '$lib/server/services/photos';

/** After the PUT: the server checks and cleans the file. 200 with the ready photo, or 413/415/422 with the reason. */
export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'photo.edit');
	return json(toApiPhoto(await completeUpload(access, idParam(event.params.photoId, 'photo'))));
});
