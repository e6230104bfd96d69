import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as log from '$lib/server/services/log';
import { benchOf } from '../../../../../../../projects/[projectId]/setups/[setupId]/bench/snapshot.server';

/**
 * The setup bench as JSON for polling: target, camera white balance, lights sorted by distance with
 * their latest readings and accepted fixes, and a `version` (also the ETag). Send `If-None-Match`
 * with the last version to get 304 when nothing changed.
 */
export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const setupId = log.parseId(event.params.setupId);
	const bench = setupId === null ? null : await benchOf(access, setupId);
	if (!bench) throw new ApiError(404, 'not_found', 'There is no such setup in this project.');
	const etag = `"${bench.snapshot.version}"`;
	const headers = { etag, 'cache-control': 'private, no-cache' };
	if (event.request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
	return json(bench.snapshot, { headers });
});
