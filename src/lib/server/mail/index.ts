/**
 * Chromaslate's outgoing mail: one function per message. Each builds the text and HTML parts from
 * `templates.ts` and sends them over SMTP (`transport.ts`). Resolves to the Message-ID.
 */
import {
	accountExistsMail,
	confirmEmailMail,
	invitationMail,
	logSharedMail,
	magicLinkMail,
	passwordResetMail
} from './templates';
import { sendMail } from './transport';

export { closeMail } from './transport';

export function sendConfirmEmail(to: string, p: Parameters<typeof confirmEmailMail>[0]): Promise<string> {
	return sendMail({ to, ...confirmEmailMail(p) });
}

export function sendMagicLink(to: string, p: Parameters<typeof magicLinkMail>[0]): Promise<string> {
	return sendMail({ to, ...magicLinkMail(p) });
}

export function sendPasswordReset(to: string, p: Parameters<typeof passwordResetMail>[0]): Promise<string> {
	return sendMail({ to, ...passwordResetMail(p) });
}

export function sendAccountExists(to: string, p: Parameters<typeof accountExistsMail>[0]): Promise<string> {
	return sendMail({ to, ...accountExistsMail(p) });
}

export function sendInvitation(to: string, p: Parameters<typeof invitationMail>[0]): Promise<string> {
	return sendMail({ to, ...invitationMail(p) });
}

export function sendLogShared(to: string, p: Parameters<typeof logSharedMail>[0]): Promise<string> {
	return sendMail({ to, ...logSharedMail(p) });
}
