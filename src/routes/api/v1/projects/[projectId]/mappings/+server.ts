import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as mappings from '$lib/server/db/column-mappings';
import { columnMappingSchema } from '$lib/import';

export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'project.view');
	return json({ items: await mappings.list(project.id) });
});

export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'reading.edit');
	const body = await jsonBody(event.request, z.object({ name: z.string().trim().min(1).max(120), mapping: columnMappingSchema }));
	return json(await mappings.save(project.id, body.name, body.mapping, user.id), { status: 201 });
});
