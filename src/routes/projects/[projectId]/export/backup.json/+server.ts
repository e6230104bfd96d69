import { projectAccess } from '$lib/server/authz';
import { backupProject } from '$lib/server/services/backup';
import { exportFileName } from '$lib/server/services/export';
import type { RequestHandler } from './$types';

/** Everything of the project as one JSON file, to keep or to restore as a new project. */
export const GET: RequestHandler = async (event) => {
	const access = await projectAccess(event, 'export.create');
	const backup = await backupProject(access);
	return new Response(JSON.stringify(backup), {
		headers: {
			'content-type': 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="${exportFileName(access.project.name, 'backup', 'json')}"`,
			'cache-control': 'no-store'
		}
	});
};
