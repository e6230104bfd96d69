import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, setTarget, toApiSetup } from '$lib/server/services/log';
import { targetBodySchema } from '$lib/schemas/log';

/** Sets the target white (`"target": null` clears it). DP and owner. */
export const PUT = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'target.set');
	const body = await jsonBody(event.request, targetBodySchema);
	const setup = await setTarget(access, idParam(event.params.setupId, 'setup'), body.target, body.tolerance, body.version).catch((e) => apiConflict(e, toApiSetup));
	return json(toApiSetup(setup));
});
