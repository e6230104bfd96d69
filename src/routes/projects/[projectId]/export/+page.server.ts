import { fail, redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { LogError } from '$lib/server/services/log';
import { parseBackup, restoreProject } from '$lib/server/services/backup';
import { LOG_CSV_COLUMNS } from '$lib/server/services/export';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	return {
		project: { id: access.project.id, name: access.project.name },
		canExport: access.can('export.create'),
		columns: LOG_CSV_COLUMNS.map((c) => ({ name: c.name, description: c.description }))
	};
};

export const actions: Actions = {
	/** Restores a backup file as a new project owned by the person restoring it. */
	restore: async (event) => {
		const access = await projectAccess(event, 'project.view');
		const form = await event.request.formData();
		const file = form.get('backup');
		const name = String(form.get('name') ?? '').trim().slice(0, 160);
		if (!(file instanceof File) || file.size === 0) return fail(400, { action: 'restore', message: 'Choose a backup file (.json) first.', values: { name } });
		let id: number;
		try {
			id = await restoreProject(access.user, parseBackup(await file.text()), { name });
		} catch (e) {
			if (e instanceof LogError) return fail(400, { action: 'restore', message: e.message, values: { name } });
			throw e;
		}
		redirect(303, `/projects/${id}`);
	}
};
