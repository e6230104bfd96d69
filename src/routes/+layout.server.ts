import type { LayoutServerLoad } from './$types';

// For the header only (who is signed in); pages and actions check permissions themselves.
export const load: LayoutServerLoad = ({ locals }) => ({
	theme: locals.theme,
	user: locals.user ? { name: locals.user.name, email: locals.user.email } : null
});
