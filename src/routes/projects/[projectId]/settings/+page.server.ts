import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { z } from 'zod';
import { projectAccess } from '$lib/server/authz';
import { LogError, type ConflictDetails } from '$lib/server/services/log';
import { projectSettingsSchema, updateDetails } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

/** What a save answers: a note, and for a save that lost the race, who saved first and both versions. */
type Message = { tone: 'good' | 'bad'; text: string; conflict?: Omit<ConflictDetails, 'current'> };

const schema = zod4(projectSettingsSchema);

export const load: PageServerLoad = async (event) => {
	const { project } = await projectAccess(event, 'project.edit');
	const form = await superValidate({ name: project.name, notes: project.notes, version: project.version }, schema, { errors: false });
	return { form, project: { id: project.id, name: project.name } };
};

export const actions: Actions = {
	default: async (event) => {
		const access = await projectAccess(event, 'project.edit');
		const form = await superValidate<z.infer<typeof projectSettingsSchema>, Message>(event.request, schema);
		if (!form.valid) return fail(400, { form });
		try {
			const saved = await updateDetails(access, form.data, form.data.version);
			form.data = { name: saved.name, notes: saved.notes, version: saved.version };
			return message(form, { tone: 'good', text: 'Saved.' });
		} catch (e) {
			if (!(e instanceof LogError) || e.logCode !== 'conflict') throw e;
			const { current: _current, ...conflict } = e.details as ConflictDetails;
			// Saving again from here keeps what was typed, over the version now stored.
			form.data.version = conflict.version;
			return message(form, { tone: 'bad', text: e.message, conflict }, { status: 409 });
		}
	}
};
