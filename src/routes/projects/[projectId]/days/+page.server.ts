import { redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { createDay, formAction, listDays } from '$lib/server/services/log';
import { daysPageQuerySchema, shootDaySchema } from '$lib/schemas/log';
import type { Actions, PageServerLoad } from './$types';

const PAGE_SIZE = 25;

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const q = daysPageQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const { items, total } = await listDays(access, { q: q.q, sort: q.sort, order: q.order, limit: PAGE_SIZE, offset: (q.page - 1) * PAGE_SIZE });
	return {
		project: { id: access.project.id, name: access.project.name },
		days: items,
		total,
		page: q.page,
		pageCount: Math.max(1, Math.ceil(total / PAGE_SIZE)),
		query: q,
		canEdit: access.can('light.edit')
	};
};

export const actions: Actions = {
	create: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return formAction(event.request, 'create', shootDaySchema, async (d) => {
			const day = await createDay(access, d);
			redirect(303, `/projects/${access.project.id}/days/${day.id}`);
		});
	}
};
