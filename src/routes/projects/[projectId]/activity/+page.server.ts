import { projectAccess } from '$lib/server/authz';
import * as activity from '$lib/server/db/activity';
import { mentionable } from '$lib/server/services/log';
import { activityQuerySchema } from '$lib/schemas/log';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 50;

const idOf = (v: unknown) => (typeof v === 'number' && Number.isInteger(v) && v > 0 ? v : null);
/** Which setup or light a photo entry is about, for its link to the photos page. */
const photoOf = (d: Record<string, unknown> | null) => ({ setupId: idOf(d?.setupId), lightId: idOf(d?.lightId) });

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const q = activityQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const { items, total } = await activity.list(access.project.id, { subjectType: q.type, userId: q.user, q: q.q, order: q.order, limit: PAGE_SIZE, offset: (q.page - 1) * PAGE_SIZE });
	return {
		project: { id: access.project.id, name: access.project.name },
		entries: items.map((a) => ({ id: a.id, at: a.createdAt, who: a.userName ?? 'a former member', action: a.action, subjectType: a.subjectType, subjectId: a.subjectId, summary: a.summary, photoOf: a.subjectType === 'photo' ? photoOf(a.details) : null, changes: (a.details?.changes as Record<string, [string, string]> | undefined) ?? null })),
		total,
		page: q.page,
		pageCount: Math.max(1, Math.ceil(total / PAGE_SIZE)),
		query: q,
		people: await mentionable(access)
	};
};
