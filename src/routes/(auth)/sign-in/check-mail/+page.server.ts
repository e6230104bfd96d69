import { dev } from '$app/environment';
import { LIFETIMES } from '$lib/server/auth/policy';
import { capturedMailDir } from '$lib/server/mail/config';
import { describeLifetime } from '$lib/server/mail/templates';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => ({
	email: url.searchParams.get('email') ?? '',
	lifetime: describeLifetime(LIFETIMES.magicLink),
	capturedMail: capturedMailDir(process.env, dev) !== null
});
