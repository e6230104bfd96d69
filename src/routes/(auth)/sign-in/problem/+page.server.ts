import { LIFETIMES } from '$lib/server/auth/policy';
import { describeLifetime } from '$lib/server/mail/templates';
import type { PageServerLoad } from './$types';

// Auth.js sends people here when a sign-in step fails (its `pages.error`).
export const load: PageServerLoad = ({ url }) => {
	const error = url.searchParams.get('error') ?? '';
	const message =
		error === 'Verification'
			? `This sign-in link has expired or has been used already. Links work once, within ${describeLifetime(LIFETIMES.magicLink)}.`
			: error === 'AccessDenied'
				? 'Signing in with that address is not possible.'
				: 'Signing in did not work this time.';
	return { message };
};
