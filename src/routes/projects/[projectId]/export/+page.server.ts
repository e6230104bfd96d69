import { fail, redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import * as log from '$lib/server/services/log';
import { LogError } from '$lib/server/services/log';
import { shareLog, shareRecipients } from '$lib/server/services/share';
import { shareLogFormSchema } from '$lib/schemas/log';
import { requestContext } from '$lib/server/auth/form';
import { parseBackup, restoreProject, type RestoreResult } from '$lib/server/services/backup';
import { LOG_CSV_COLUMNS } from '$lib/server/services/export';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	return {
		project: { id: access.project.id, name: access.project.name },
		canExport: access.can('export.create'),
		recipients: access.can('export.create') ? await shareRecipients(access) : [],
		columns: LOG_CSV_COLUMNS.map((c) => ({ name: c.name, description: c.description }))
	};
};

export const actions: Actions = {
	/** Mails the review link to someone on the project, with a note. */
	share: async (event) => {
		const access = await projectAccess(event, 'export.create');
		return log.formAction(event.request, 'share', shareLogFormSchema, async (d) => {
			const { name } = await shareLog(access, d, requestContext(event).origin);
			return { message: `Sent to ${name}.` };
		});
	},
	/** Restores a backup file as a new project owned by the person restoring it, with its crew if asked. */
	restore: async (event) => {
		const access = await projectAccess(event, 'project.view');
		const form = await event.request.formData();
		const file = form.get('backup');
		const name = String(form.get('name') ?? '').trim().slice(0, 160);
		const keepMembers = form.get('keepMembers') === 'on';
		const values = { name, keepMembers: keepMembers ? 'on' : '' };
		if (!(file instanceof File) || file.size === 0) return fail(400, { action: 'restore', message: 'Choose a backup file (.json) first.', values });
		let restored: RestoreResult;
		try {
			restored = await restoreProject(access.user, parseBackup(await file.text()), { name, keepMembers, origin: requestContext(event).origin });
		} catch (e) {
			if (e instanceof LogError) return fail(400, { action: 'restore', message: e.message, values });
			throw e;
		}
		const counts: Record<string, string> = keepMembers ? { added: String(restored.added.length), invited: String(restored.invited.length), mailFailed: String(restored.mailFailed.length) } : {};
		redirect(303, `/projects/${restored.projectId}?${new URLSearchParams({ restored: '1', ...counts })}`);
	}
};
