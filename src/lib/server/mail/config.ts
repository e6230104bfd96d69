/**
 * Mail settings from the environment. Production: SMTP_HOST, SMTP_PORT, SMTP_SECURE, SMTP_USER,
 * SMTP_PASSWORD, MAIL_FROM. `npm start` and `npm test` point SMTP_* at the local mail catcher and
 * set MAIL_DIR, where the catcher writes what it receives.
 */

export interface MailConfig {
	host: string;
	port: number;
	/** TLS from the first byte (port 465); otherwise STARTTLS is used when the server offers it. */
	secure: boolean;
	auth: { user: string; pass: string } | null;
	from: string;
}

export const DEFAULT_FROM = 'Chromaslate <no-reply@chromaslate.example>';

export function mailConfig(env: NodeJS.ProcessEnv = process.env): MailConfig {
	const port = Number(env.SMTP_PORT ?? 2525);
	const user = env.SMTP_USER ?? '';
	return {
		host: env.SMTP_HOST ?? '127.0.0.1',
		port: Number.isFinite(port) && port > 0 ? port : 2525,
		secure: /^(1|true|yes)$/i.test(env.SMTP_SECURE ?? ''),
		auth: user ? { user, pass: env.SMTP_PASSWORD ?? '' } : null,
		from: env.MAIL_FROM?.trim() || DEFAULT_FROM
	};
}

/**
 * Where captured mail can be read, or null when there is none to show. Only our own scripts set
 * MAIL_DIR (next to the local catcher); in `vite dev` the catcher's default folder is used. A
 * production build without MAIL_DIR therefore has no captured mail, and `/dev/mail` answers 404.
 */
export function capturedMailDir(env: NodeJS.ProcessEnv, isDev: boolean): string | null {
	const dir = env.MAIL_DIR?.trim();
	if (dir) return dir;
	return isDev ? '.data/mail' : null;
}
