import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { isCredentialsError, signInWithPassword } from '$lib/server/auth';
import { requestContext } from '$lib/server/auth/form';
import { describeWait } from '$lib/server/auth/policy';
import { requireUser, ROLE_LABELS } from '$lib/server/authz';
import { changeDisplayName, changePassword, changePasswordSchema, displayNameSchema, hasPassword } from '$lib/server/services/auth';
import { listMyProjects } from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

type Message = { tone: 'good' | 'bad'; text: string };
const nameSchema = zod4(displayNameSchema);
const passwordSchema = zod4(changePasswordSchema);
const NO_SECRETS = { currentPassword: '', newPassword: '', repeatPassword: '' };

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event.locals, event.url);
	const [nameForm, passwordForm, projects, withPassword] = await Promise.all([
		superValidate({ name: user.name }, nameSchema, { id: 'name', errors: false }),
		superValidate(passwordSchema, { id: 'password' }),
		listMyProjects(user),
		hasPassword(user.email)
	]);
	return {
		account: { name: user.name, email: user.email },
		hasPassword: withPassword,
		nameForm,
		passwordForm,
		projects: projects.map((p) => ({ id: p.id, name: p.name, role: p.role, roleLabel: ROLE_LABELS[p.role], archived: p.archivedAt !== null, memberCount: p.memberCount }))
	};
};

export const actions: Actions = {
	name: async (event) => {
		const user = requireUser(event.locals, event.url);
		const form = await superValidate<{ name: string }, Message>(event.request, nameSchema, { id: 'name' });
		if (!form.valid) return fail(400, { nameForm: form });
		const saved = await changeDisplayName(user.id, form.data.name);
		form.data.name = saved.name;
		return message(form, { tone: 'good', text: `Saved. The crew now sees you as ${saved.name}.` });
	},
	password: async (event) => {
		const user = requireUser(event.locals, event.url);
		const form = await superValidate<typeof NO_SECRETS, Message>(event.request, passwordSchema, { id: 'password' });
		const { currentPassword, newPassword } = form.data;
		form.data = { ...NO_SECRETS }; // passwords never travel back to the page
		if (!form.valid) return fail(400, { passwordForm: form });
		const result = await changePassword(user, currentPassword, newPassword, requestContext(event));
		if (!result.ok) {
			if (result.reason === 'limited') return message(form, { tone: 'bad', text: `Too many tries. Wait ${describeWait(result.retryAfterSeconds)} and try again.` }, { status: 429 });
			if (result.reason === 'no-password') return message(form, { tone: 'bad', text: 'This account signs in by e-mail link and has no password yet. Set one with a reset link.' }, { status: 400 });
			form.errors.currentPassword = ['That is not your current password.'];
			return fail(400, { passwordForm: form });
		}
		// Every session ended with the old password, this browser's too: sign it in again with the new one.
		try {
			await signInWithPassword(event, user.email, newPassword, '/account');
		} catch (e) {
			if (isCredentialsError(e)) redirect(303, `/sign-in?${new URLSearchParams({ reset: '1', email: user.email })}`);
			throw e;
		}
		return message(form, { tone: 'good', text: 'Your password is changed. Other devices were signed out; this one stays signed in.' });
	}
};
