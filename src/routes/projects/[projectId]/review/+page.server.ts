import { projectAccess } from '$lib/server/authz';
import { requestContext } from '$lib/server/auth/form';
import * as log from '$lib/server/services/log';
import { reviewLog } from '$lib/server/services/review';
import { commentSchema, idFormSchema, reviewQuerySchema } from '$lib/schemas/log';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const q = reviewQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	return {
		project: { id: access.project.id, name: access.project.name },
		permissions: access.permissions,
		query: q,
		members: await log.mentionable(access),
		review: await reviewLog(access, { dayId: q.day, setupId: q.setup, kind: q.kind || undefined, page: q.page })
	};
};

export const actions: Actions = {
	comment: async (event) => {
		const access = await projectAccess(event, 'comment.create');
		return log.formAction(
			event.request,
			'comment',
			commentSchema,
			async (d) => {
				const r = await log.addComment(access, d, requestContext(event).origin);
				return { commentId: r.comment.id, mentioned: r.mentioned };
			},
			(f) => ({ subjectType: String(f.get('subjectType') ?? ''), subjectId: log.formId(f, 'subjectId') })
		);
	},
	deleteComment: async (event) => {
		const access = await projectAccess(event, 'comment.create');
		return log.formAction(event.request, 'deleteComment', idFormSchema('commentId'), async (_d, f) => void (await log.deleteComment(access, log.formId(f, 'commentId'))));
	}
};
