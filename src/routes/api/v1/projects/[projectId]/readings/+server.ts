import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as readings from '$lib/server/db/readings';
import { createReadingChecked, toApiReading } from '$lib/server/services/readings-api';
import { createReadingSchema, listReadingsQuerySchema } from '$lib/schemas/readings';

export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'project.view');
	const q = listReadingsQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const { items, total } = await readings.list(project.id, {
		setupId: q.setup,
		lightId: q.light,
		from: q.from,
		to: q.to,
		kind: q.kind,
		sort: q.sort,
		order: q.order,
		limit: q.limit,
		offset: q.offset
	});
	return json({ items: items.map((r) => toApiReading(r, { spectrum: false })), total, limit: q.limit, offset: q.offset });
});

export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	const body = await jsonBody(event.request, createReadingSchema);
	const reading = await createReadingChecked(project.id, user.id, body);
	return json(toApiReading(reading, { spectrum: true }), { status: 201 });
});
