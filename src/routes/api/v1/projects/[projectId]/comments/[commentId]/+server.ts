import { json } from '@sveltejs/kit';
import { ApiError, apiRoute, apiUser, idParam, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { apiConflict, deleteComment, readComment, toApiComment, updateComment } from '$lib/server/services/log';
import { commentPatchSchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const comment = await readComment(access, idParam(event.params.commentId, 'comment'));
	if (!comment) throw new ApiError(404, 'not_found', 'There is no such comment in this project.');
	return json(toApiComment(comment));
});

/** The author corrects their comment. */
export const PATCH = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'comment.create');
	const body = await jsonBody(event.request, commentPatchSchema);
	const comment = await updateComment(access, idParam(event.params.commentId, 'comment'), body.body, body.version).catch((e) => apiConflict(e, toApiComment));
	return json(toApiComment(comment));
});

export const DELETE = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'comment.create');
	await deleteComment(access, idParam(event.params.commentId, 'comment'));
	return new Response(null, { status: 204 });
});
