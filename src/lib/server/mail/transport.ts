/** Sends a message over SMTP with nodemailer; one pooled transport per process. */
import nodemailer, { type Transporter } from 'nodemailer';
import { mailConfig } from './config';

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html: string;
}

let transporter: Transporter | undefined;

function transport(): Transporter {
	if (!transporter) {
		const c = mailConfig();
		transporter = nodemailer.createTransport({
			host: c.host,
			port: c.port,
			secure: c.secure,
			...(c.auth ? { auth: c.auth } : {}),
			pool: true,
			maxConnections: 2,
			connectionTimeout: 10_000,
			greetingTimeout: 10_000,
			socketTimeout: 20_000
		});
	}
	return transporter;
}

/** Sends the message and returns its Message-ID; throws if the server refuses the recipient. */
export async function sendMail(mail: OutgoingMail): Promise<string> {
	const info = await transport().sendMail({ from: mailConfig().from, ...mail });
	const refused = [...(info.rejected ?? []), ...(info.pending ?? [])];
	if (refused.length > 0) throw new Error(`The mail server refused ${refused.length} recipient(s).`);
	return info.messageId;
}

/** Closes pooled connections (at shutdown, or between tests). */
export function closeMail(): void {
	transporter?.close();
	transporter = undefined;
}
