import { json } from '@sveltejs/kit';
import { apiRoute, apiUser } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as customGels from '$lib/server/db/custom-gels';
import { addCustomGel, customGelView, multipartForm } from '$lib/server/services/library';

/** The project's own custom filters (the shared ones are at /api/v1/library/gels). */
export const GET = apiRoute(async (event) => {
	const { project } = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	return json({ items: (await customGels.list(project.id)).map(customGelView) });
});

/**
 * multipart/form-data: `file` (CSV: wavelength_nm and one column of % or 0–1), `name`, `notes`,
 * `unit` (auto | percent | fraction). Returns the filter with its mired and Duv shift on 3200 K and
 * 5600 K and its light loss. Editing the project library takes `light.edit` (it changes the fixes).
 */
export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'light.edit');
	return json(await addCustomGel(access.project.id, access.user.id, await multipartForm(event.request)), { status: 201 });
});
