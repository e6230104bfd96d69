import { json } from '@sveltejs/kit';
import { apiRoute, apiUser } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { listOverrides } from '$lib/server/services/library';

/** The project's overrides of built-in filters' nominal figures. */
export const GET = apiRoute(async (event) => {
	const { project } = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	return json({ items: await listOverrides(project.id) });
});
