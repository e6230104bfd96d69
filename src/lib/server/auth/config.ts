/**
 * The Auth.js configuration: e-mail + password (Credentials) and e-mail links (Nodemailer), over our
 * Knex adapter. Sessions are JWT cookies (Auth.js refuses database sessions with Credentials), but
 * each JWT carries the id of a row in `sessions`, checked on every request: signing out, a password
 * reset or expiry deletes the row, and the cookie stops working at once.
 */
import { randomBytes } from 'node:crypto';
import type { SvelteKitAuthConfig } from '@auth/sveltekit';
import { CredentialsSignin } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { db } from '$lib/server/db';
import * as users from '$lib/server/db/users';
import { mailConfig } from '$lib/server/mail/config';
import { sendMagicLink } from '$lib/server/mail';
import { passwordUser, signInSchema } from '$lib/server/services/auth';
import { createKnexAdapter, parseUserId, readSessionWithUser } from './knex-adapter';
import { LIFETIMES } from './policy';
import type { SessionUser } from './types';

export const adapter = createKnexAdapter(db);

/** Where Auth.js's own endpoints live (its default under SvelteKit). */
export const AUTH_BASE_PATH = '/auth';

/**
 * Secure cookies whenever the site is served over https, and in any production build that is not on a
 * loopback address (where plain http would be a mistake the browser should refuse).
 */
export function secureCookies(env: NodeJS.ProcessEnv, isDev: boolean): boolean {
	const origin = env.AUTH_URL || env.ORIGIN;
	if (!origin) return !isDev;
	try {
		const u = new URL(origin);
		if (u.protocol === 'https:') return true;
		const loopback = ['127.0.0.1', 'localhost', '[::1]'].includes(u.hostname);
		return !isDev && !loopback;
	} catch {
		return !isDev;
	}
}

/** The link in the mail opens our own page first, so a mail scanner fetching it does not use it up. */
export function magicLinkLanding(authCallbackUrl: string): string {
	const u = new URL(authCallbackUrl);
	const landing = new URL('/sign-in/link', u.origin);
	for (const key of ['token', 'email', 'callbackUrl']) {
		const v = u.searchParams.get(key);
		if (v !== null) landing.searchParams.set(key, v);
	}
	return landing.toString();
}

const QUIET_ERRORS = new Set(['CredentialsSignin', 'Verification']);

export function buildAuthConfig(opts: { secure: boolean }): SvelteKitAuthConfig {
	return {
		adapter,
		session: { strategy: 'jwt', maxAge: LIFETIMES.session, updateAge: LIFETIMES.sessionRefresh },
		useSecureCookies: opts.secure,
		trustHost: true,
		pages: { signIn: '/sign-in', signOut: '/sign-out', error: '/sign-in/problem', verifyRequest: '/sign-in/check-mail' },
		logger: {
			// AUTH_URL and the base path are both set on purpose; the rest is worth seeing.
			warn: (code) => {
				if (code !== 'env-url-basepath-redundant') console.warn('[auth] warning:', code);
			},
			error: (e) => {
				const type = (e as { type?: string }).type ?? e.name;
				if (!QUIET_ERRORS.has(type)) console.error('[auth]', e);
			}
		},
		providers: [
			Credentials({
				credentials: { email: { type: 'email' }, password: { type: 'password' } },
				async authorize(credentials) {
					const parsed = signInSchema.safeParse(credentials);
					if (!parsed.success) throw new CredentialsSignin();
					const user = await passwordUser(parsed.data.email, parsed.data.password);
					if (!user) throw new CredentialsSignin();
					return { id: String(user.id), email: user.email, name: user.name };
				}
			}),
			Nodemailer({
				server: { host: mailConfig().host, port: mailConfig().port },
				from: mailConfig().from,
				maxAge: LIFETIMES.magicLink,
				async sendVerificationRequest({ identifier, url }) {
					await sendMagicLink(identifier, { url: magicLinkLanding(url), lifetimeSeconds: LIFETIMES.magicLink });
				}
			})
		],
		callbacks: {
			async signIn({ user, account, email }) {
				// Someone could have made an unconfirmed account for another person's address with a password of
				// their own. When the real owner confirms the address with an e-mail link, that password goes.
				if (account?.provider === 'nodemailer' && !email?.verificationRequest && 'emailVerified' in user && !user.emailVerified) {
					const id = parseUserId(user.id);
					if (id !== null) await users.update(id, { passwordHash: null });
				}
				return true;
			},
			async jwt({ token, user }) {
				if (user) {
					const sid = randomBytes(32).toString('base64url');
					await adapter.createSession({
						sessionToken: sid,
						userId: String(user.id),
						expires: new Date(Date.now() + LIFETIMES.session * 1000)
					});
					return { sub: String(user.id), sid, name: user.name ?? '', email: user.email ?? '' };
				}
				const sid = typeof token.sid === 'string' ? token.sid : null;
				const found = sid ? await readSessionWithUser(db, sid) : null;
				if (!sid || !found) return null;
				const now = Date.now();
				if (found.expires.getTime() <= now) {
					await adapter.deleteSession(sid);
					return null;
				}
				if (found.expires.getTime() - LIFETIMES.session * 1000 + LIFETIMES.sessionRefresh * 1000 <= now) {
					await adapter.updateSession({ sessionToken: sid, expires: new Date(now + LIFETIMES.session * 1000) });
				}
				const u = found.user;
				return { ...token, sub: String(u.id), name: u.name, email: u.email, admin: u.isAdmin };
			},
			async session({ session, token }) {
				const user: SessionUser = {
					id: Number(token.sub),
					email: String(token.email ?? ''),
					name: String(token.name ?? ''),
					isAdmin: token.admin === true
				};
				return { ...session, user: { ...session.user, ...user, id: String(user.id) }, chromaslate: user };
			}
		},
		events: {
			async signOut(message) {
				const sid = 'token' in message ? message.token?.sid : null;
				if (typeof sid === 'string') await adapter.deleteSession(sid);
			}
		}
	};
}
