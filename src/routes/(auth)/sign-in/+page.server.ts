import { fail, redirect } from '@sveltejs/kit';
import { isCredentialsError, requestMagicLink, signInWithPassword } from '$lib/server/auth';
import { parseForm, requestContext, safeRedirect } from '$lib/server/auth/form';
import { countAttempt, describeWait } from '$lib/server/auth/policy';
import { checkPassword, emailOnlySchema, signInSchema } from '$lib/server/services/auth';
import type { Actions, PageServerLoad } from './$types';

const NOTICES: Record<string, string> = {
	confirmed: 'Your address is confirmed. Sign in to carry on.',
	reset: 'Your new password is set, and other devices were signed out. Sign in with it now.',
	signedOut: 'You are signed out.'
};

export const load: PageServerLoad = ({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const notice = Object.keys(NOTICES).find((k) => url.searchParams.has(k));
	return { redirectTo, email: url.searchParams.get('email') ?? '', notice: notice ? NOTICES[notice] : null };
};

export const actions: Actions = {
	password: async (event) => {
		const form = await event.request.formData();
		const redirectTo = safeRedirect(String(form.get('redirectTo') ?? ''));
		const parsed = parseForm(signInSchema, form);
		if (!parsed.ok) return fail(400, { form: 'password', issues: parsed.issues, values: parsed.values });
		const values = { email: parsed.data.email };
		const check = await checkPassword(parsed.data.email, parsed.data.password, requestContext(event));
		if (!check.ok) {
			const message =
				check.reason === 'limited'
					? `Too many tries. Wait ${describeWait(check.retryAfterSeconds)} and try again, or ask for an e-mail link.`
					: check.reason === 'unconfirmed'
						? 'Confirm your address first: we have sent a fresh confirmation link to it.'
						: 'That e-mail and password do not match. Check both, or ask for an e-mail link below.';
			return fail(check.reason === 'limited' ? 429 : 400, { form: 'password', message, values });
		}
		try {
			await signInWithPassword(event, parsed.data.email, parsed.data.password, redirectTo);
		} catch (e) {
			if (isCredentialsError(e)) {
				return fail(400, { form: 'password', message: 'That e-mail and password do not match.', values });
			}
			throw e;
		}
		redirect(303, redirectTo);
	},

	link: async (event) => {
		const form = await event.request.formData();
		const redirectTo = safeRedirect(String(form.get('redirectTo') ?? ''));
		const parsed = parseForm(emailOnlySchema, form);
		if (!parsed.ok) return fail(400, { form: 'link', issues: parsed.issues, values: parsed.values });
		const limit = await countAttempt('magic-link', { address: parsed.data.email, ip: requestContext(event).ip });
		if (!limit.allowed) {
			const message = `Too many links asked for. Wait ${describeWait(limit.retryAfterSeconds)}, then try again.`;
			return fail(429, { form: 'link', message, values: { email: parsed.data.email } });
		}
		await requestMagicLink(event, parsed.data.email, redirectTo);
		redirect(303, `/sign-in/check-mail?${new URLSearchParams({ email: parsed.data.email })}`);
	}
};
