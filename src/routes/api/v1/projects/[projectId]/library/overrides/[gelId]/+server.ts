import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { clearOverride, overrideSchema, setOverride } from '$lib/server/services/library';

// Editing the project library changes the fixes proposed for its lights, so it takes the
// permission to add and edit lights (`light.edit`: owner, DP, gaffer).

/** `{ miredShift?, lossStops?, note? }` for one built-in filter (e.g. `ctb-half`); returns the filter as the project now sees it. */
export const PUT = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	const body = await jsonBody(event.request, overrideSchema);
	return json(await setOverride(access.project.id, access.user.id, event.params.gelId ?? '', body));
});

/** Back to the built-in figures. */
export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	await clearOverride(access.project.id, access.user.id, event.params.gelId ?? '');
	return new Response(null, { status: 204 });
});
