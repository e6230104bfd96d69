import { describe, expect, it } from 'vitest';
import { magicLinkLanding, secureCookies } from '$lib/server/auth/config';
import { capturedMailDir, mailConfig, DEFAULT_FROM } from '$lib/server/mail/config';

describe('secureCookies', () => {
	it('always over https', () => {
		expect(secureCookies({ AUTH_URL: 'https://chromaslate.example' }, false)).toBe(true);
		expect(secureCookies({ ORIGIN: 'https://127.0.0.1:3000' }, true)).toBe(true);
	});
	it('plain http on a loopback address (npm start, tests) works without Secure', () => {
		expect(secureCookies({ AUTH_URL: 'http://127.0.0.1:3000' }, false)).toBe(false);
		expect(secureCookies({ ORIGIN: 'http://localhost:5173' }, true)).toBe(false);
	});
	it('a production build on any other host insists on Secure', () => {
		expect(secureCookies({ ORIGIN: 'http://chromaslate.example' }, false)).toBe(true);
		expect(secureCookies({}, false)).toBe(true);
		expect(secureCookies({}, true)).toBe(false);
	});
});

describe('magicLinkLanding', () => {
	it('points the mail at our own page, carrying token, address and callback only', () => {
		const auth = 'http://127.0.0.1:3000/auth/callback/nodemailer?callbackUrl=http%3A%2F%2F127.0.0.1%3A3000%2Fprojects&token=abcDEF123_-xyz0000&email=gaffer%40example.test&extra=1';
		const landing = new URL(magicLinkLanding(auth));
		expect(landing.origin + landing.pathname).toBe('http://127.0.0.1:3000/sign-in/link');
		expect(Object.fromEntries(landing.searchParams)).toEqual({
			token: 'abcDEF123_-xyz0000',
			email: 'gaffer@example.test',
			callbackUrl: 'http://127.0.0.1:3000/projects'
		});
	});
});

describe('mail settings', () => {
	it('read SMTP_* and MAIL_FROM, with defaults for the local catcher', () => {
		expect(mailConfig({})).toEqual({ host: '127.0.0.1', port: 2525, secure: false, auth: null, from: DEFAULT_FROM });
		expect(
			mailConfig({ SMTP_HOST: 'smtp.example.org', SMTP_PORT: '465', SMTP_SECURE: 'true', SMTP_USER: 'u', SMTP_PASSWORD: 'p', MAIL_FROM: 'Crew <c@example.org>' })
		).toEqual({ host: 'smtp.example.org', port: 465, secure: true, auth: { user: 'u', pass: 'p' }, from: 'Crew <c@example.org>' });
		expect(mailConfig({ SMTP_PORT: 'nonsense' }).port).toBe(2525);
	});
	it('captured mail exists only with MAIL_DIR (our scripts) or in vite dev; a production build without it has none', () => {
		expect(capturedMailDir({ MAIL_DIR: '/tmp/m' }, false)).toBe('/tmp/m');
		expect(capturedMailDir({}, true)).toBe('.data/mail');
		expect(capturedMailDir({}, false)).toBeNull();
		expect(capturedMailDir({ MAIL_DIR: '  ' }, false)).toBeNull();
	});
});
