import { fail, redirect } from '@sveltejs/kit';
import { projectAccess, ROLE_LABELS } from '$lib/server/authz';
import { parseForm } from '$lib/server/auth/form';
import { deleteProject, deleteSchema, listMembers, setArchived, versionSchema } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const members = await listMembers(access);
	const { project } = access;
	const q = event.url.searchParams;
	const count = (k: string) => (/^\d{1,4}$/.test(q.get(k) ?? '') ? Number(q.get(k)) : null);
	return {
		restored: q.has('restored') ? { added: count('added'), invited: count('invited'), mailFailed: count('mailFailed') } : null,
		project: { id: project.id, name: project.name, notes: project.notes, archived: project.archivedAt !== null, version: project.version },
		role: access.role,
		roleLabel: ROLE_LABELS[access.role],
		permissions: access.permissions,
		members: members.map((m) => ({ userId: m.userId, name: m.name || m.email, roleLabel: ROLE_LABELS[m.role], isYou: m.userId === access.user.id }))
	};
};

async function archiveAction(event: Parameters<Actions[string]>[0], archived: boolean) {
	const access = await projectAccess(event, 'project.archive');
	const parsed = parseForm(versionSchema, await event.request.formData());
	if (!parsed.ok) return fail(400, { issues: parsed.issues });
	const result = await setArchived(access, archived, parsed.data.version);
	if (!result.ok) return fail(409, { message: 'Someone changed this project a moment ago. Look again, then retry.' });
	return { archived };
}

export const actions: Actions = {
	archive: (event) => archiveAction(event, true),
	restore: (event) => archiveAction(event, false),
	delete: async (event) => {
		const access = await projectAccess(event, 'project.delete');
		const parsed = parseForm(deleteSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { issues: parsed.issues });
		const result = await deleteProject(access, parsed.data.confirmName);
		if (!result.ok) return fail(400, { issues: { confirmName: ['That is not the project’s name. Type it exactly to delete.'] } });
		redirect(303, '/projects');
	}
};
