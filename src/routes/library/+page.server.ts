import { error } from '@sveltejs/kit';
import { canSite, requireUser } from '$lib/server/authz';
import { idParam } from '$lib/server/api';
import { addCustomGel, addFixtureProfile, libraryAction, removeCustomGel, removeFixtureProfile, sharedLibrary } from '$lib/server/services/library';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/** The shared library is readable without an account (it holds no project's data); changing it is for site admins. */
export const load: PageServerLoad = async ({ locals }) => ({
	library: await sharedLibrary(),
	canManage: canSite(locals.user, 'library.manage'),
	signedIn: locals.user != null
});

function admin(event: RequestEvent) {
	const user = requireUser(event.locals, event.url);
	if (!canSite(user, 'library.manage')) error(403, { message: 'Only a site admin can change the shared library.', code: 'forbidden' });
	return user;
}

export const actions: Actions = {
	addGel: async (event) => {
		const user = admin(event);
		const form = await event.request.formData();
		return libraryAction(form, 'addGel', async () => ({ ...(await addCustomGel(null, user.id, form)) }));
	},
	removeGel: async (event) => {
		const user = admin(event);
		const form = await event.request.formData();
		return libraryAction(form, 'removeGel', () => removeCustomGel(null, user.id, idParam(String(form.get('id') ?? ''), 'custom filter')));
	},
	addFixture: async (event) => {
		const user = admin(event);
		const form = await event.request.formData();
		return libraryAction(form, 'addFixture', async () => ({ ...(await addFixtureProfile(null, user.id, form)) }));
	},
	removeFixture: async (event) => {
		const user = admin(event);
		const form = await event.request.formData();
		return libraryAction(form, 'removeFixture', async () => ({ ...(await removeFixtureProfile(null, user.id, idParam(String(form.get('id') ?? ''), 'fixture profile'))) }));
	}
};
