import { fail, redirect } from '@sveltejs/kit';
import { parseForm, requestContext } from '$lib/server/auth/form';
import { describeWait, LIFETIMES } from '$lib/server/auth/policy';
import { describeLifetime } from '$lib/server/mail/templates';
import { emailOnlySchema, requestPasswordReset } from '$lib/server/services/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, '/projects');
	return { lifetime: describeLifetime(LIFETIMES.resetPassword) };
};

export const actions: Actions = {
	default: async (event) => {
		const parsed = parseForm(emailOnlySchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { issues: parsed.issues, values: parsed.values });
		const result = await requestPasswordReset(parsed.data.email, requestContext(event));
		if (!result.ok) {
			return fail(429, {
				message: `Too many reset requests. Wait ${describeWait(result.retryAfterSeconds)} and try again.`,
				values: { email: parsed.data.email }
			});
		}
		return { sent: true, email: parsed.data.email };
	}
};
