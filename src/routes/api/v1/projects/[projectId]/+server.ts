import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict } from '$lib/server/services/log';
import { projectPatchSchema, toApiProject, updateDetails } from '$lib/server/services/projects';

/** The project: name, notes, archived or not, version, and your role on it. */
export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	return json(toApiProject(access.project, access.role));
});

/** `{ version, name?, notes? }`; 409 with who saved first and both versions when `version` is stale. */
export const PATCH = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.edit');
	const { version, ...patch } = await jsonBody(event.request, projectPatchSchema);
	const project = await updateDetails(access, patch, version).catch((e) => apiConflict(e, (p) => toApiProject(p, access.role)));
	return json(toApiProject(project, access.role));
});
