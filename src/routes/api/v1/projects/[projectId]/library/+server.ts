import { json } from '@sveltejs/kit';
import { apiRoute, apiUser } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { projectLibrary } from '$lib/server/services/library';

/** The project's library as its fixes use it: built-in filters with its overrides, custom filters, fixture profiles. */
export const GET = apiRoute(async (event) => {
	const { project } = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	return json(await projectLibrary(project.id));
});
