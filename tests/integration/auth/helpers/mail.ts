/**
 * Reading mail the local catcher captured (MAIL_DIR, set by `npm test`). Used by the integration and
 * browser tests; relative imports only, so Playwright can load it too.
 */
import { listCaptured, type CapturedMail } from '../../../../src/lib/server/mail/catcher';
import { extractLinks } from '../../../../src/lib/server/mail/mime';

export function mailDir(): string {
	const dir = process.env.MAIL_DIR;
	if (!dir) throw new Error('MAIL_DIR is not set: run the tests through `npm test`.');
	return dir;
}

/**
 * Waits for the newest message to `to` (matching `subject` if given) that arrived after `since`.
 * Polls the catcher's folder; fails after `timeoutMs`.
 */
export async function waitForMail(
	to: string,
	opts: { subject?: RegExp; since?: Date; timeoutMs?: number } = {}
): Promise<CapturedMail> {
	const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
	const since = opts.since?.toISOString() ?? '';
	for (;;) {
		const found = (await listCaptured(mailDir())).find(
			(m) => m.to.includes(to.toLowerCase()) && m.receivedAt >= since && (!opts.subject || opts.subject.test(m.mail.subject))
		);
		if (found) return found;
		if (Date.now() > deadline) throw new Error(`No mail to ${to}${opts.subject ? ` matching ${opts.subject}` : ''} within the time allowed`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

/** All messages to `to` received after `since`. */
export async function mailTo(to: string, since?: Date): Promise<CapturedMail[]> {
	const s = since?.toISOString() ?? '';
	return (await listCaptured(mailDir())).filter((m) => m.to.includes(to.toLowerCase()) && m.receivedAt >= s);
}

/** The first link in the plain-text part whose path starts with `pathPrefix`. */
export function linkIn(mail: CapturedMail, pathPrefix: string): string {
	const link = extractLinks(mail.mail.text ?? '').find((l) => new URL(l).pathname.startsWith(pathPrefix));
	if (!link) throw new Error(`No ${pathPrefix} link in "${mail.mail.subject}":\n${mail.mail.text}`);
	return link;
}
