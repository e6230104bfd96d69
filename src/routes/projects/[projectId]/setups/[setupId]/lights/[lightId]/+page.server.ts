import { error, redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { commentActions } from '$lib/server/comment-actions';
import * as log from '$lib/server/services/log';
import { lightFormSchema, typedReadingFormSchema, versionFormSchema } from '$lib/schemas/log';
import type { Actions, PageServerLoad } from './$types';

const notFound = () => error(404, 'There is no such light in this setup.');
const ids = (e: { params: { setupId: string; lightId: string } }) => ({ setupId: log.parseId(e.params.setupId) ?? notFound(), lightId: log.parseId(e.params.lightId) ?? notFound() });

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const { setupId, lightId } = ids(event);
	const view = await log.lightPage(access, setupId, lightId);
	if (!view) error(404, 'There is no such light in this setup.');
	return { project: { id: access.project.id, name: access.project.name }, permissions: access.permissions, members: await log.mentionable(access), ...view };
};

export const actions: Actions = {
	update: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return log.formAction(event.request, 'update', lightFormSchema.and(versionFormSchema), async ({ version, ...d }) => {
			await log.updateLight(access, ids(event).lightId, d, version);
			return { message: 'Saved.' };
		});
	},
	delete: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return log.formAction(event.request, 'delete', versionFormSchema.partial(), async () => {
			await log.deleteLight(access, ids(event).lightId);
			redirect(303, `/projects/${access.project.id}/setups/${ids(event).setupId}`);
		});
	},
	addReading: async (event) => {
		const access = await projectAccess(event, 'reading.edit');
		return log.formAction(event.request, 'addReading', typedReadingFormSchema, async (d) => {
			await log.addReading(access, ids(event).lightId, d);
			return { message: 'Reading saved.' };
		});
	},
	...commentActions
};
