import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { acceptFix, fixView, readLight, toApiLight } from '$lib/server/services/log';
import * as fixes from '$lib/server/db/fixes';
import { fixBodySchema } from '$lib/schemas/log';
import { ApiError } from '$lib/server/api';

/** The light's accepted fixes, newest first. */
export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const lightId = idParam(event.params.lightId, 'light');
	if (!(await readLight(access, lightId))) throw new ApiError(404, 'not_found', 'There is no such light in this project.');
	const list = await fixes.list(access.project.id, { lightId });
	return json({ items: list.map((f) => ({ id: f.id, kind: f.kind, fix: f.fix, predicted: f.predicted, target: f.target, note: f.note, setting: fixView(f).setting, accepted_by: f.acceptedBy, accepted_by_name: f.acceptedByName, accepted_at: f.acceptedAt.toISOString() })) });
});

/** Accepts a fix: records it (with the setup's target, who and when) and sets it on the light. */
export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'fix.accept');
	const body = await jsonBody(event.request, fixBodySchema);
	const { fix, light } = await acceptFix(access, idParam(event.params.lightId, 'light'), body);
	return json({ fix: { id: fix.id, kind: fix.kind, setting: fixView(fix).setting, accepted_by: fix.acceptedBy, accepted_at: fix.acceptedAt.toISOString() }, light: toApiLight(light) }, { status: 201 });
});
