import { error, redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { createSetup, deleteDay, formAction, listSetups, parseId, readDay, updateDay } from '$lib/server/services/log';
import { setupFormSchema, shootDaySchema, versionFormSchema } from '$lib/schemas/log';
import type { Actions, PageServerLoad } from './$types';

const dayId = (raw: string) => parseId(raw) ?? error(404, 'There is no such shoot day in this project.');

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const day = await readDay(access, dayId(event.params.dayId));
	if (!day) error(404, 'There is no such shoot day in this project.');
	return {
		project: { id: access.project.id, name: access.project.name },
		day,
		setups: await listSetups(access, { shootDayId: day.id }),
		canEdit: access.can('light.edit')
	};
};

export const actions: Actions = {
	update: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return formAction(event.request, 'update', shootDaySchema.extend(versionFormSchema.shape), async ({ version, ...d }) => {
			await updateDay(access, dayId(event.params.dayId), d, version);
			return { message: 'Saved.' };
		});
	},
	delete: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return formAction(event.request, 'delete', versionFormSchema.partial(), async () => {
			await deleteDay(access, dayId(event.params.dayId));
			redirect(303, `/projects/${access.project.id}/days`);
		});
	},
	createSetup: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return formAction(event.request, 'createSetup', setupFormSchema, async (d) => {
			const s = await createSetup(access, { ...d, shootDayId: dayId(event.params.dayId) });
			redirect(303, `/projects/${access.project.id}/setups/${s.id}`);
		});
	}
};
