import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { parseForm } from '$lib/server/auth/form';
import { createProject, projectSchema } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	requireUser(locals, url);
};

export const actions: Actions = {
	default: async ({ locals, url, request }) => {
		const user = requireUser(locals, url);
		const parsed = parseForm(projectSchema, await request.formData());
		if (!parsed.ok) return fail(400, { issues: parsed.issues, values: parsed.values });
		const project = await createProject(user, parsed.data);
		redirect(303, `/projects/${project.id}`);
	}
};
