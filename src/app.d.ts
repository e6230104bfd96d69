// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Theme } from '$lib/theme';

declare global {
	namespace App {
		interface Error {
			message: string;
			code?: string;
		}
		interface Locals {
			theme: Theme;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
