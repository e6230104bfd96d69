import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { confirmUploadChecked } from '$lib/server/services/readings-api';

const body = z.object({ setupId: z.number().int().positive().nullish(), lightId: z.number().int().positive().nullish() });

export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	const assign = event.request.headers.get('content-length') === '0' ? {} : await jsonBody(event.request, body);
	return json(await confirmUploadChecked(project.id, idParam(event.params.uploadId, 'upload'), user.id, assign));
});
