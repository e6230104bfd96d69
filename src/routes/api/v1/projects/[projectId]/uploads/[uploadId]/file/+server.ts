import { ApiError, apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import * as uploads from '$lib/server/db/uploads';

/** The original file, byte for byte. */
export const GET = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'project.view');
	const id = idParam(event.params.uploadId, 'upload');
	const meta = await uploads.read(project.id, id);
	const bytes = meta && (await uploads.content(project.id, id));
	if (!meta || !bytes) throw new ApiError(404, 'not_found', 'There is no such upload in this project.');
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': 'application/octet-stream',
			'content-disposition': `attachment; filename="${meta.filename.replace(/[^\w.\- ]/g, '_')}"`,
			'x-content-sha256': meta.sha256
		}
	});
});
