import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { createDay, listDays, toApiDay } from '$lib/server/services/log';
import { listDaysQuerySchema, shootDaySchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const q = listDaysQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const { items, total } = await listDays(access, q);
	return json({ items: items.map((d) => ({ ...toApiDay(d), setup_count: d.setupCount, light_count: d.lightCount })), total, limit: q.limit, offset: q.offset });
});

export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const day = await createDay(access, await jsonBody(event.request, shootDaySchema));
	return json(toApiDay(day), { status: 201 });
});
