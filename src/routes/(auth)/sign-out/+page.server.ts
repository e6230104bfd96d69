import { redirect } from '@sveltejs/kit';
import { signOutHere } from '$lib/server/auth';
import { safeRedirect } from '$lib/server/auth/form';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (!locals.user) redirect(303, '/sign-in');
	return { user: { name: locals.user.name, email: locals.user.email } };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const next = form.get('redirectTo');
		if (event.locals.user) await signOutHere(event);
		redirect(303, next ? safeRedirect(String(next), '/sign-in?signedOut=1') : '/sign-in?signedOut=1');
	}
};
