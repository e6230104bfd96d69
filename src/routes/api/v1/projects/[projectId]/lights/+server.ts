import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { createLight, listLights, toApiLight } from '$lib/server/services/log';
import { lightSchema, listLightsQuerySchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const q = listLightsQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const items = await listLights(access, { setupId: q.setup, kind: q.kind });
	return json({ items: items.map(toApiLight), total: items.length });
});

export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const { setupId, ...fields } = await jsonBody(event.request, lightSchema);
	const light = await createLight(access, setupId, fields);
	return json(toApiLight(light), { status: 201 });
});
