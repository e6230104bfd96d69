import type { PageServerLoad } from './$types';

// The e-mail link lands here first; the button then opens Auth.js's callback, which uses the token.
export const load: PageServerLoad = ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	const email = url.searchParams.get('email') ?? '';
	const callbackUrl = url.searchParams.get('callbackUrl') ?? '';
	if (!/^[A-Za-z0-9_-]{16,200}$/.test(token) || !email) return { href: null, email };
	const params = new URLSearchParams({ token, email });
	if (callbackUrl) params.set('callbackUrl', callbackUrl);
	return { href: `/auth/callback/nodemailer?${params}`, email };
};
