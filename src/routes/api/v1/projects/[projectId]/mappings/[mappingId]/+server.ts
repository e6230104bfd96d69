import { ApiError, apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as mappings from '$lib/server/db/column-mappings';

export const DELETE = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	if (!(await mappings.destroy(project.id, idParam(event.params.mappingId, 'mapping')))) {
		throw new ApiError(404, 'not_found', 'There is no such saved mapping.');
	}
	return new Response(null, { status: 204 });
});
