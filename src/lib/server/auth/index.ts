/**
 * Sign-in for the rest of the app. Everything that knows about Auth.js stays in this folder:
 * - `authHandles`: the request hooks (guard Auth.js's endpoints, run Auth.js, put the user on
 *   `event.locals.user`), composed in `src/hooks.server.ts`;
 * - `signInWithPassword`, `requestMagicLink`, `signOutHere`: what our form actions call.
 */
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { SvelteKitAuth } from '@auth/sveltekit';
import { Auth, createActionURL, raw, setEnvDefaults, skipCSRFCheck } from '@auth/core';
import { AuthError } from '@auth/core/errors';
import { dev } from '$app/environment';
import { env } from '$env/dynamic/private';
import { AUTH_BASE_PATH, buildAuthConfig, secureCookies } from './config';
import type { SessionUser } from './types';

export type { SessionUser } from './types';

const config = buildAuthConfig({ secure: secureCookies(process.env, dev) });
const sveltekitAuth = SvelteKitAuth(config);

/** The same defaults @auth/sveltekit applies before each request, for our direct calls. */
function prepared() {
	config.trustHost ??= true;
	config.basePath = AUTH_BASE_PATH;
	config.skipCSRFCheck = skipCSRFCheck;
	setEnvDefaults(env, config, true);
	return config;
}

/**
 * Auth.js's endpoints answer only GET over HTTP (the e-mail link, session and CSRF reads, its page
 * redirects). Sign-in and sign-out go through our own form actions, which apply the rate limits and
 * SvelteKit's origin check, and call Auth.js in-process.
 */
const guardAuthEndpoints: Handle = async ({ event, resolve }) => {
	const p = event.url.pathname;
	if ((p === AUTH_BASE_PATH || p.startsWith(AUTH_BASE_PATH + '/')) && !['GET', 'HEAD'].includes(event.request.method)) {
		return new Response('Not found', { status: 404 });
	}
	return resolve(event);
};

function sessionCookiePresent(event: RequestEvent): boolean {
	return event.cookies.getAll().some((c) => c.name.includes('authjs.session-token'));
}

/** Reads the user from a session Auth.js accepted (see the jwt and session callbacks in config.ts). */
export function userFromSession(session: unknown): SessionUser | null {
	const u = (session as { chromaslate?: Partial<SessionUser> } | null)?.chromaslate;
	if (!u || typeof u.id !== 'number' || !Number.isInteger(u.id) || u.id <= 0 || typeof u.email !== 'string') return null;
	return { id: u.id, email: u.email, name: u.name ?? '', isAdmin: u.isAdmin === true };
}

/**
 * Asks Auth.js for the session in-process, like `locals.auth()` does, but copies its cookies with
 * their options intact (SvelteKit would otherwise add `Secure` to cookies that came back without it).
 */
async function readSession(event: RequestEvent): Promise<unknown> {
	const cfg = prepared();
	const url = createActionURL('session', event.url.protocol, event.request.headers, env, cfg);
	const res = await Auth(new Request(url, { headers: { cookie: event.request.headers.get('cookie') ?? '' } }), { ...cfg, raw });
	for (const c of res.cookies ?? []) event.cookies.set(c.name, c.value, { path: '/', ...c.options });
	return res.body ?? null;
}

const putUserOnLocals: Handle = async ({ event, resolve }) => {
	event.locals.user = sessionCookiePresent(event) ? userFromSession(await readSession(event)) : null;
	return resolve(event);
};

export const authHandles: Handle = sequence(guardAuthEndpoints, sveltekitAuth.handle, putUserOnLocals);

type AuthAction = 'signin' | 'callback' | 'signout';

/** Calls Auth.js in-process (as @auth/sveltekit's own actions do) and copies its cookies to the response. */
async function callAuth(event: RequestEvent, action: AuthAction, provider: string | null, body: Record<string, string>): Promise<string | undefined> {
	const cfg = prepared();
	const headers = new Headers(event.request.headers);
	headers.delete('content-length');
	headers.set('content-type', 'application/x-www-form-urlencoded');
	const url = createActionURL(action, event.url.protocol, headers, env, cfg);
	const target = provider ? `${url}/${provider}` : url.toString();
	const res = await Auth(new Request(target, { method: 'POST', headers, body: new URLSearchParams(body) }), { ...cfg, raw });
	for (const c of res.cookies ?? []) event.cookies.set(c.name, c.value, { path: '/', ...c.options });
	return res.redirect;
}

/** True for Auth.js's "these credentials are wrong" error (a thrown CredentialsSignin). */
export function isCredentialsError(e: unknown): boolean {
	return e instanceof AuthError && e.type === 'CredentialsSignin';
}

/**
 * Starts a session for an address and password the caller has already checked (and rate-limited).
 * Throws Auth.js's CredentialsSignin if they do not match after all; see `isCredentialsError`.
 */
export async function signInWithPassword(event: RequestEvent, email: string, password: string, redirectTo: string): Promise<void> {
	await callAuth(event, 'callback', 'credentials', { email, password, callbackUrl: redirectTo });
}

/** Mails a sign-in link (Auth.js makes and stores the token; our mail code sends it). */
export async function requestMagicLink(event: RequestEvent, email: string, redirectTo: string): Promise<void> {
	await callAuth(event, 'signin', 'nodemailer', { email, callbackUrl: redirectTo });
}

/** Ends this browser's session: the cookie is cleared and its `sessions` row deleted. */
export async function signOutHere(event: RequestEvent): Promise<void> {
	await callAuth(event, 'signout', null, { callbackUrl: '/sign-in' });
}
