import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { deletePhoto, patchPhotoSchema, readPhoto, setCaption, toApiPhoto } from '$lib/server/services/photos';

export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'project.view');
	return json(toApiPhoto(await readPhoto(access, idParam(event.params.photoId, 'photo'))));
});

/** `{ caption }` */
export const PATCH = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'photo.edit');
	const body = await jsonBody(event.request, patchPhotoSchema);
	return json(toApiPhoto(await setCaption(access, idParam(event.params.photoId, 'photo'), body.caption)));
});

export const DELETE = apiRoute(async (event) => {
	const user = await apiUser(event);
	const access = await requireProjectPermission(user, event.params.projectId, 'photo.edit');
	await deletePhoto(access, idParam(event.params.photoId, 'photo'));
	return new Response(null, { status: 204 });
});
