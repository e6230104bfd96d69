import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { projectAccess } from '$lib/server/authz';
import * as assignments from '$lib/server/db/assignments';
import { createReadingChecked } from '$lib/server/services/readings-api';
import { ApiError } from '$lib/server/api';
import { toRawReading, typedReadingFormSchema } from '$lib/schemas/typed-reading';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { project } = await projectAccess(event, 'reading.edit');
	const lightId = event.url.searchParams.get('light') ?? '';
	const form = await superValidate({ mode: 'xy' as const, lightId }, zod4(typedReadingFormSchema), { errors: false });
	return { form, project: { id: project.id, name: project.name }, setups: await assignments.list(project.id) };
};

export const actions: Actions = {
	default: async (event) => {
		const { project, user } = await projectAccess(event, 'reading.edit');
		const form = await superValidate(event.request, zod4(typedReadingFormSchema));
		if (!form.valid) return fail(400, { form });
		const result = toRawReading(form.data);
		if ('errors' in result) {
			for (const [field, message] of Object.entries(result.errors)) setError(form, field as 'x', message as string);
			return fail(400, { form });
		}
		const lightId = form.data.lightId ? Number(form.data.lightId) : null;
		const takenAt = form.data.takenAt ? new Date(form.data.takenAt).toISOString() : new Date().toISOString();
		try {
			await createReadingChecked(project.id, user.id, { label: form.data.label, raw: result.raw, lightId, takenAt });
		} catch (e) {
			if (e instanceof ApiError && e.status === 400) return setError(form, 'label', e.message);
			throw e;
		}
		redirect(303, `/projects/${project.id}/readings?added=1`);
	}
};
