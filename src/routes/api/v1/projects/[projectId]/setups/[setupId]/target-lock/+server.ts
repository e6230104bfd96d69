import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, lockTarget, toApiSetup } from '$lib/server/services/log';
import { lockBodySchema } from '$lib/schemas/log';

/** Locks or unlocks the target white: `{ "locked": true, "version": n }`. DP and owner. */
export const PUT = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'target.lock');
	const body = await jsonBody(event.request, lockBodySchema);
	const setup = await lockTarget(access, idParam(event.params.setupId, 'setup'), body.locked, body.version).catch((e) => apiConflict(e, toApiSetup));
	return json(toApiSetup(setup));
});
