import { projectAccess } from '$lib/server/authz';
import { idParam } from '$lib/server/api';
import {
	addCustomGel,
	addFixtureProfile,
	clearOverride,
	libraryAction,
	overrideSchema,
	projectLibrary,
	removeCustomGel,
	removeFixtureProfile,
	setOverride
} from '$lib/server/services/library';
import type { Actions, PageServerLoad } from './$types';

// Editing the project library changes the fixes proposed for the project's lights, so it takes
// the permission to add and edit lights (`light.edit`: owner, DP, gaffer). Every member can read it.

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event, 'project.view');
	return {
		project: { id: access.project.id, name: access.project.name },
		library: await projectLibrary(access.project.id),
		canEdit: access.can('light.edit')
	};
};

export const actions: Actions = {
	setOverride: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'setOverride', async () => {
			const body = overrideSchema.parse({ miredShift: form.get('miredShift') ?? '', lossStops: form.get('lossStops') ?? '', note: form.get('note') ?? '' });
			const filter = await setOverride(access.project.id, access.user.id, String(form.get('gelId') ?? ''), body);
			return { gelId: filter.id };
		});
	},
	clearOverride: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'clearOverride', () => clearOverride(access.project.id, access.user.id, String(form.get('gelId') ?? '')));
	},
	addGel: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'addGel', async () => ({ ...(await addCustomGel(access.project.id, access.user.id, form)) }));
	},
	removeGel: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'removeGel', () => removeCustomGel(access.project.id, access.user.id, idParam(String(form.get('id') ?? ''), 'custom filter')));
	},
	addFixture: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'addFixture', async () => ({ ...(await addFixtureProfile(access.project.id, access.user.id, form)) }));
	},
	removeFixture: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const form = await event.request.formData();
		return libraryAction(form, 'removeFixture', async () => ({ ...(await removeFixtureProfile(access.project.id, access.user.id, idParam(String(form.get('id') ?? ''), 'fixture profile'))) }));
	}
};
