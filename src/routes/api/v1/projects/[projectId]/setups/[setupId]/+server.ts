import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, deleteSetup, readSetup, resolveTarget, toApiSetup, updateSetup } from '$lib/server/services/log';
import { setupPatchSchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const setup = await readSetup(access, idParam(event.params.setupId, 'setup'));
	if (!setup) throw new ApiError(404, 'not_found', 'There is no such setup in this project.');
	const target = setup.target ? await resolveTarget(access.project.id, setup.target, setup.targetTolerance) : null;
	return json({ ...toApiSetup(setup), target_resolved: target && { label: target.label, x: target.x, y: target.y, u_prime: target.u_prime, v_prime: target.v_prime, cct_k: target.CCT, duv: target.Duv, mired: target.mired } });
});

export const PATCH = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const { version, ...patch } = await jsonBody(event.request, setupPatchSchema);
	const setup = await updateSetup(access, idParam(event.params.setupId, 'setup'), patch, version!).catch((e) => apiConflict(e, toApiSetup));
	return json(toApiSetup(setup));
});

export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	await deleteSetup(access, idParam(event.params.setupId, 'setup'));
	return new Response(null, { status: 204 });
});
