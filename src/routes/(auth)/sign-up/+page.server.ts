import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { signInWithPassword } from '$lib/server/auth';
import { parseForm, requestContext, safeRedirect } from '$lib/server/auth/form';
import { PASSWORD_MIN } from '$lib/server/auth/password';
import { describeWait } from '$lib/server/auth/policy';
import { nameField, passwordField, signUp, signUpSchema, signUpWithInvitation } from '$lib/server/services/auth';
import { readInvitation } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

const invitedSchema = z.object({ name: nameField, password: passwordField });

export const load: PageServerLoad = async ({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const inviteToken = url.searchParams.get('invite');
	const invite = inviteToken ? await readInvitation(inviteToken) : null;
	return {
		redirectTo,
		passwordMin: PASSWORD_MIN,
		inviteToken: invite ? inviteToken : null,
		invite: invite && { email: invite.email, projectName: invite.projectName, roleLabel: invite.roleLabel },
		inviteGone: Boolean(inviteToken) && !invite
	};
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const inviteToken = String(form.get('invite') ?? '');
		if (inviteToken) {
			const parsed = parseForm(invitedSchema, form);
			if (!parsed.ok) return fail(400, { issues: parsed.issues, values: parsed.values });
			const made = await signUpWithInvitation(inviteToken, parsed.data);
			if (!made.ok) {
				const message =
					made.reason === 'exists'
						? 'This address has an account already: sign in to accept the invitation.'
						: 'This invitation has expired or has been used. Ask the project owner for a new one.';
				return fail(400, { message, values: parsed.values });
			}
			await signInWithPassword(event, made.email, parsed.data.password, `/projects/${made.projectId}`);
			redirect(303, `/projects/${made.projectId}`);
		}

		const parsed = parseForm(signUpSchema, form);
		if (!parsed.ok) return fail(400, { issues: parsed.issues, values: parsed.values });
		const result = await signUp(parsed.data, requestContext(event));
		if (!result.ok) {
			return fail(429, {
				message: `Too many sign-ups from here. Wait ${describeWait(result.retryAfterSeconds)} and try again.`,
				values: parsed.values
			});
		}
		return { sent: true, email: parsed.data.email };
	}
};
