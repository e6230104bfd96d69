import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as readings from '$lib/server/db/readings';
import { patchReadingChecked, toApiReading } from '$lib/server/services/readings-api';
import { patchReadingSchema } from '$lib/schemas/readings';

export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'project.view');
	const reading = await readings.read(project.id, idParam(event.params.readingId, 'reading'));
	if (!reading) throw new ApiError(404, 'not_found', 'There is no such reading in this project.');
	return json(toApiReading(reading, { spectrum: true }));
});

export const PATCH = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	const body = await jsonBody(event.request, patchReadingSchema);
	const reading = await patchReadingChecked(project.id, idParam(event.params.readingId, 'reading'), user.id, body);
	return json(toApiReading(reading, { spectrum: false }));
});

export const DELETE = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	const ok = await readings.destroy(project.id, idParam(event.params.readingId, 'reading'), user.id);
	if (!ok) throw new ApiError(404, 'not_found', 'There is no such reading in this project.');
	return new Response(null, { status: 204 });
});
