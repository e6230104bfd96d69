import { fail, redirect } from '@sveltejs/kit';
import { confirmEmail, confirmationIsUsable } from '$lib/server/services/auth';
import type { Actions, PageServerLoad } from './$types';

// Opening the link only shows a button: mail scanners that fetch links do not use it up.
export const load: PageServerLoad = async ({ params }) => ({ usable: await confirmationIsUsable(params.token) });

export const actions: Actions = {
	default: async ({ params }) => {
		const result = await confirmEmail(params.token);
		if (!result.ok) return fail(400, { message: 'This link has expired or has been used already.' });
		redirect(303, `/sign-in?${new URLSearchParams({ confirmed: '1', email: result.email })}`);
	}
};
