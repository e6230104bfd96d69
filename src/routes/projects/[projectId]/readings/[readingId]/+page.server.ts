import { error } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { parseId } from '$lib/server/services/log';
import { readingDetail } from '$lib/server/services/spectra';
import type { PageServerLoad } from './$types';

/** One reading: where it sits on the chart, its spectrum against its references, CRI bars, swatch and numbers. */
export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const id = parseId(event.params.readingId);
	const detail = id === null ? null : await readingDetail(access, id);
	if (!detail) error(404, 'There is no such reading in this project.');
	return { project: { id: access.project.id, name: access.project.name }, ...detail };
};
