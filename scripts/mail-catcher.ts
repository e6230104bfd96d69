/**
 * The local mail catcher for development and tests: an SMTP server on 127.0.0.1 that accepts every
 * message and stores it under MAIL_DIR as `<time>-<id>.eml` (the raw message) plus a `.json`
 * envelope. Production sends through a real SMTP server instead (SMTP_* settings).
 *
 *   node --import tsx scripts/mail-catcher.ts     (MAIL_PORT, default 2525; MAIL_DIR, default .data/mail)
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';

const port = Number(process.env.MAIL_PORT ?? 2525);
const dir = process.env.MAIL_DIR ?? '.data/mail';
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	banner: 'Chromaslate local mail catcher',
	size: 25 * 1024 * 1024,
	onData(stream, session, callback) {
		const chunks: Buffer[] = [];
		stream.on('data', (c: Buffer) => chunks.push(c));
		stream.on('end', () => {
			const id = randomUUID();
			const base = `${new Date().toISOString().replace(/[:.]/g, '-')}-${id}`;
			writeFileSync(join(dir, `${base}.eml`), Buffer.concat(chunks));
			writeFileSync(
				join(dir, `${base}.json`),
				JSON.stringify({
					id,
					receivedAt: new Date().toISOString(),
					from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
					to: session.envelope.rcptTo.map((r) => r.address)
				})
			);
			callback();
		});
	}
});

server.on('error', (e) => console.error('[mail-catcher]', e.message));
server.listen(port, '127.0.0.1', () => console.log(`[mail-catcher] listening on 127.0.0.1:${port}, storing in ${dir}`));
const stop = () => server.close(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
