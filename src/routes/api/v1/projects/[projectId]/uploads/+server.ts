import { json } from '@sveltejs/kit';
import { apiRoute, apiUser } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { previewUploadRequest } from '$lib/server/services/readings-api';

/** multipart/form-data with `file` (and optionally `mapping` as JSON): stores the file, returns the parse report. */
export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	return json(await previewUploadRequest(event.request, project.id, user.id), { status: 201 });
});
