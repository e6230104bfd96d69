import { projectAccess } from '$lib/server/authz';
import * as photoRows from '$lib/server/db/photos';
import { listPhotos, uploadRules } from '$lib/server/services/photos';
import type { PageServerLoad } from './$types';

const positive = (raw: string | null) => (raw && /^[1-9][0-9]{0,9}$/.test(raw) ? Number(raw) : undefined);

/** The project's photos, filtered by `?setup=` or `?light=`, with what is needed to add more. */
export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event, 'project.view');
	// `?setup=12` or `?light=5`; the filter form without JavaScript sends `?filter=setup=12`.
	const params = new URLSearchParams(event.url.searchParams.get('filter') ?? event.url.search);
	const setup = positive(params.get('setup'));
	const light = positive(params.get('light'));
	const [list, subjects] = await Promise.all([
		listPhotos(access, { setup: light ? undefined : setup, light, status: 'ready', limit: 200, offset: 0 }),
		photoRows.subjects(access.project.id)
	]);
	return {
		project: { id: access.project.id, name: access.project.name },
		photos: list.items,
		total: list.total,
		subjects,
		filter: { setup: light ? undefined : setup, light },
		canEdit: access.can('photo.edit'),
		rules: uploadRules()
	};
};
