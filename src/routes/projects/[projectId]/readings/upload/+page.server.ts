import { projectAccess } from '$lib/server/authz';
import * as assignments from '$lib/server/db/assignments';
import * as mappings from '$lib/server/db/column-mappings';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { project } = await projectAccess(event, 'reading.edit');
	return {
		project: { id: project.id, name: project.name },
		setups: await assignments.list(project.id),
		mappings: await mappings.list(project.id)
	};
};
