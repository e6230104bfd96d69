import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, deleteDay, readDay, toApiDay, updateDay } from '$lib/server/services/log';
import { shootDayPatchSchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const day = await readDay(access, idParam(event.params.dayId, 'shoot day'));
	if (!day) throw new ApiError(404, 'not_found', 'There is no such shoot day in this project.');
	return json(toApiDay(day));
});

export const PATCH = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const { version, ...patch } = await jsonBody(event.request, shootDayPatchSchema);
	const day = await updateDay(access, idParam(event.params.dayId, 'shoot day'), patch, version!).catch((e) => apiConflict(e, toApiDay));
	return json(toApiDay(day));
});

export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	await deleteDay(access, idParam(event.params.dayId, 'shoot day'));
	return new Response(null, { status: 204 });
});
