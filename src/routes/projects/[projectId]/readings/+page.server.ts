import { projectAccess } from '$lib/server/authz';
import * as assignments from '$lib/server/db/assignments';
import * as readings from '$lib/server/db/readings';
import { toApiReading } from '$lib/server/services/readings-api';
import { listReadingsQuerySchema } from '$lib/schemas/readings';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event, 'project.view');
	const parsed = listReadingsQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	const q = parsed.success ? parsed.data : listReadingsQuerySchema.parse({});
	const first = await readings.list(access.project.id, { setupId: q.setup, sort: q.sort, order: q.order, limit: 25, offset: q.offset });
	return {
		project: { id: access.project.id, name: access.project.name },
		canEdit: access.can('reading.edit'),
		setups: await assignments.list(access.project.id),
		initial: { items: first.items.map((r) => toApiReading(r, { spectrum: false })), total: first.total, query: { ...q, limit: 25 } },
		added: event.url.searchParams.get('added')
	};
};
