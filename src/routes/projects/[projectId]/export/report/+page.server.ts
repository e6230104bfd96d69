import { projectAccess } from '$lib/server/authz';
import { reviewLog } from '$lib/server/services/review';
import { reviewQuerySchema } from '$lib/schemas/log';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event, 'export.create');
	const q = reviewQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	return {
		project: { id: access.project.id, name: access.project.name, notes: access.project.notes },
		printedBy: access.user.name || access.user.email,
		printedAt: new Date(),
		review: await reviewLog(access, { dayId: q.day, setupId: q.setup, kind: q.kind || undefined, pageSize: 0 })
	};
};
