import { fail, redirect } from '@sveltejs/kit';
import { PASSWORD_MIN } from '$lib/server/auth/password';
import { parseForm } from '$lib/server/auth/form';
import { newPasswordSchema, resetIsUsable, resetPassword } from '$lib/server/services/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => ({ usable: await resetIsUsable(params.token), passwordMin: PASSWORD_MIN });

export const actions: Actions = {
	default: async ({ params, request }) => {
		const parsed = parseForm(newPasswordSchema, await request.formData());
		if (!parsed.ok) return fail(400, { issues: parsed.issues });
		const result = await resetPassword(params.token, parsed.data.password);
		if (!result.ok) return fail(400, { message: 'This reset link has expired or has been used already. Ask for a new one.' });
		redirect(303, `/sign-in?${new URLSearchParams({ reset: '1', email: result.email })}`);
	}
};
