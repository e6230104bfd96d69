/**
 * The comment form actions, shared by every log page that shows a comment thread (setup, light,
 * review): each still asks authz itself, through `projectAccess`, on every request.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { projectAccess } from './authz';
import { requestContext } from './auth/form';
import * as log from './services/log';
import { commentSchema, idFormSchema } from '$lib/schemas/log';

type ProjectEvent = RequestEvent<{ projectId: string }>;

export const commentActions = {
	comment: async (event: ProjectEvent) => {
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
	deleteComment: async (event: ProjectEvent) => {
		const access = await projectAccess(event, 'comment.create');
		return log.formAction(
			event.request,
			'deleteComment',
			idFormSchema('commentId'),
			async (_d, f) => void (await log.deleteComment(access, log.formId(f, 'commentId'))),
			(f) => ({ commentId: log.formId(f, 'commentId') })
		);
	}
};
