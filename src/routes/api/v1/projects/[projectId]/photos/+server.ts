import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { createPhotoSchema, listPhotosQuery, listPhotos, requestUpload } from '$lib/server/services/photos';

/** The project's photos, newest first. `?setup=`, `?light=`, `?status=ready|pending|rejected|any`, `?limit=`, `?offset=`. */
export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'project.view');
	const query = listPhotosQuery.parse(Object.fromEntries(event.url.searchParams));
	return json(await listPhotos(access, query));
});

/**
 * Asks for an upload: `{ filename, type, size, setupId | lightId, caption? }`. Answers 201 with the
 * pending photo and a presigned PUT (`upload.url`, send `upload.headers`), then POST `complete_url`.
 */
export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'photo.edit');
	const body = await jsonBody(event.request, createPhotoSchema);
	return json(await requestUpload(access, body), { status: 201 });
});
