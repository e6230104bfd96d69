// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Theme } from '$lib/theme';
import type { SessionUser } from '$lib/server/auth/types';

declare global {
	namespace App {
		interface Error {
			message: string;
			code?: string;
		}
		interface Locals {
			theme: Theme;
			/** The signed-in person, or null. Set in hooks.server.ts; routes check permission through $lib/server/authz. */
			user: SessionUser | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
