import type { Handle } from '@sveltejs/kit';
import { THEME_COOKIE, parseTheme } from '$lib/theme';
import { closeDb } from '$lib/server/db';

// Release pooled connections at shutdown, or adapter-node waits for idle sockets (about 30 s).
process.on('sveltekit:shutdown', () => {
	void closeDb();
});

export const handle: Handle = async ({ event, resolve }) => {
	const theme = parseTheme(event.cookies.get(THEME_COOKIE));
	event.locals.theme = theme;
	return resolve(event, {
		transformPageChunk: ({ html }) => html.replace('%chromaslate.theme%', theme)
	});
};
