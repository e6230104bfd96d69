import { projectAccess } from '$lib/server/authz';
import { commentActions } from '$lib/server/comment-actions';
import * as log from '$lib/server/services/log';
import { reviewLog } from '$lib/server/services/review';
import { reviewQuerySchema } from '$lib/schemas/log';
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
	...commentActions
};
