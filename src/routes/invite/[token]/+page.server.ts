import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { acceptInvitation, readInvitation } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const view = await readInvitation(params.token);
	const user = locals.user;
	return {
		token: params.token,
		invitation: view && { email: view.email, roleLabel: view.roleLabel, projectName: view.projectName, inviterName: view.inviterName, expiresAt: view.expiresAt },
		user: user && { email: user.email, name: user.name },
		sameAddress: Boolean(view && user && view.email === user.email.toLowerCase())
	};
};

export const actions: Actions = {
	accept: async ({ locals, url, params }) => {
		const user = requireUser(locals, url);
		const result = await acceptInvitation(params.token, user);
		if (!result.ok) {
			const message =
				result.reason === 'other-address'
					? 'This invitation is for another address. Sign out, then sign in or make an account with that address.'
					: 'This invitation has expired or has been used. Ask the project owner for a new one.';
			return fail(400, { message });
		}
		redirect(303, `/projects/${result.projectId}`);
	}
};
