import { error } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { listCaptured } from '$lib/server/mail/catcher';
import { capturedMailDir } from '$lib/server/mail/config';
import type { PageServerLoad } from './$types';

// Only where our scripts run the local mail catcher (MAIL_DIR set) or in `vite dev`; otherwise 404.
export const load: PageServerLoad = async () => {
	const dir = capturedMailDir(process.env, dev);
	if (!dir) error(404, { message: 'Not found' });
	const messages = await listCaptured(dir);
	return {
		messages: messages.slice(0, 200).map((m) => ({ id: m.id, receivedAt: m.receivedAt, to: m.to.join(', '), subject: m.mail.subject }))
	};
};
