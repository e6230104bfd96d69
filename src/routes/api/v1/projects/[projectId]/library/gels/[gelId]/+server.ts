import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { readCustomGel, removeCustomGel } from '$lib/server/services/library';

export const GET = apiRoute(async (event) => {
	const { project } = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	return json(await readCustomGel(project.id, idParam(event.params.gelId, 'custom filter')));
});

/** Editing the project library takes `light.edit` (it changes the fixes proposed for its lights). */
export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	await removeCustomGel(access.project.id, access.user.id, idParam(event.params.gelId, 'custom filter'));
	return new Response(null, { status: 204 });
});
