import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { createSetup, listSetups, toApiSetup } from '$lib/server/services/log';
import { listSetupsQuerySchema, setupSchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const q = listSetupsQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const items = await listSetups(access, { shootDayId: q.day });
	return json({ items: items.map((s) => ({ ...toApiSetup(s), light_count: s.lightCount })), total: items.length });
});

export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const setup = await createSetup(access, await jsonBody(event.request, setupSchema));
	return json(toApiSetup(setup), { status: 201 });
});
