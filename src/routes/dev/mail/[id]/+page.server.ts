import { error } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { readCaptured } from '$lib/server/mail/catcher';
import { capturedMailDir } from '$lib/server/mail/config';
import { extractLinks } from '$lib/server/mail/mime';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const dir = capturedMailDir(process.env, dev);
	if (!dir) error(404, { message: 'Not found' });
	const m = await readCaptured(dir, params.id);
	if (!m) error(404, { message: 'No such captured message.' });
	return {
		message: {
			id: m.id,
			receivedAt: m.receivedAt,
			from: m.mail.from,
			to: m.to.join(', '),
			subject: m.mail.subject,
			text: m.mail.text,
			html: m.mail.html,
			links: extractLinks(m.mail.text ?? '')
		}
	};
};
