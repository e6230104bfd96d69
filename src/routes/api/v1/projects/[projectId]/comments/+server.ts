import { json } from '@sveltejs/kit';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { requestContext } from '$lib/server/auth/form';
import { addComment, listComments, toApiComment } from '$lib/server/services/log';
import { commentSchema, listCommentsQuerySchema } from '$lib/schemas/log';

export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const q = listCommentsQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const items = await listComments(access, { subjectType: q.subject_type, subjectId: q.subject_id, limit: q.limit, offset: q.offset });
	return json({ items: items.map(toApiComment), limit: q.limit, offset: q.offset });
});

/** Adds a comment; members named as @Name are mailed. */
export const POST = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'comment.create');
	const body = await jsonBody(event.request, commentSchema);
	const { comment, mentioned, mailFailed } = await addComment(access, body, requestContext(event).origin);
	return json({ ...toApiComment(comment), mentioned, mail_failed: mailFailed }, { status: 201 });
});
