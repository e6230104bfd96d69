import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, deleteLight, readLight, toApiLight, updateLight } from '$lib/server/services/log';
import { lightPatchSchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const light = await readLight(access, idParam(event.params.lightId, 'light'));
	if (!light) throw new ApiError(404, 'not_found', 'There is no such light in this project.');
	return json(toApiLight(light));
});

export const PATCH = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const { version, ...patch } = await jsonBody(event.request, lightPatchSchema);
	const light = await updateLight(access, idParam(event.params.lightId, 'light'), patch as Parameters<typeof updateLight>[2], version!).catch((e) => apiConflict(e, toApiLight));
	return json(toApiLight(light));
});

export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	await deleteLight(access, idParam(event.params.lightId, 'light'));
	return new Response(null, { status: 204 });
});
