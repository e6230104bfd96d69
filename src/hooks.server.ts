import type { Handle } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { THEME_COOKIE, parseTheme } from '$lib/theme';
import { closeDb } from '$lib/server/db';
import { authHandles } from '$lib/server/auth';

// Release pooled connections at shutdown, or adapter-node waits for idle sockets (about 30 s).
process.on('sveltekit:shutdown', () => {
	void closeDb();
});

const themeHandle: Handle = async ({ event, resolve }) => {
	const theme = parseTheme(event.cookies.get(THEME_COOKIE));
	event.locals.theme = theme;
	return resolve(event, {
		transformPageChunk: ({ html }) => html.replace('%chromaslate.theme%', theme)
	});
};

// Theme first (it only reads a cookie), then sign-in: Auth.js's endpoints and `event.locals.user`.
export const handle: Handle = sequence(themeHandle, authHandles);
