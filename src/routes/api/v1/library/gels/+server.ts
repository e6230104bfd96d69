import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, ApiError } from '$lib/server/api';
import { canSite } from '$lib/server/authz';
import * as customGels from '$lib/server/db/custom-gels';
import { addCustomGel, customGelView, multipartForm } from '$lib/server/services/library';

/** Shared custom filters (public). */
export const GET = apiRoute(async () => json({ items: (await customGels.list(null)).map(customGelView) }));

/** multipart/form-data: `file` (CSV: wavelength_nm and one column of % or 0–1), `name`, `notes`, `unit` (auto | percent | fraction). Site admins only. */
export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	if (!canSite(user, 'library.manage')) throw new ApiError(403, 'forbidden', 'Only a site admin can change the shared library.');
	return json(await addCustomGel(null, user.id, await multipartForm(event.request)), { status: 201 });
});
