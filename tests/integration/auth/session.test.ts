import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { JWT } from '@auth/core/jwt';
import { closeDb, db } from '$lib/server/db';
import * as users from '$lib/server/db/users';
import { buildAuthConfig } from '$lib/server/auth/config';
import { LIFETIMES } from '$lib/server/auth/policy';
import { userFromSession } from '$lib/server/auth';
import { endAllSessions } from '$lib/server/services/auth';
import { makeUser } from './helpers/factories';

// The session rules live in the Auth.js callbacks; call them as Auth.js does.
const config = buildAuthConfig({ secure: false });
type JwtCallback = (p: { token: JWT; user?: { id: string; name?: string; email?: string } }) => Promise<JWT | null>;
const jwt = config.callbacks!.jwt as unknown as JwtCallback;
const sessionCb = config.callbacks!.session as unknown as (p: { session: { user: object; expires: string }; token: JWT }) => Promise<unknown>;

async function signIn(userId: number): Promise<JWT> {
	const token = await jwt({ token: {}, user: { id: String(userId), name: 'n', email: 'e' } });
	if (!token) throw new Error('sign-in refused');
	return token;
}

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	await closeDb();
});

describe('sessions', () => {
	it('signing in creates a sessions row and a JWT carrying its id', async () => {
		const user = await makeUser();
		const token = await signIn(user.id);
		expect(token.sub).toBe(String(user.id));
		expect(typeof token.sid).toBe('string');
		const row = await db('sessions').where({ session_token: token.sid }).first();
		expect(row.user_id).toBe(user.id);
		expect(Math.abs(row.expires.getTime() - (Date.now() + LIFETIMES.session * 1000))).toBeLessThan(5000);
	});

	it('each request re-reads the user: name, address and admin flag are current, and reach locals.user', async () => {
		const user = await makeUser({ name: 'Old Name' });
		const token = await signIn(user.id);
		await users.update(user.id, { name: 'New Name', isAdmin: true });
		const next = await jwt({ token });
		expect(next).toMatchObject({ sub: String(user.id), name: 'New Name', email: user.email, admin: true });
		const session = await sessionCb({ session: { user: {}, expires: new Date().toISOString() }, token: next! });
		expect(userFromSession(session)).toEqual({ id: user.id, email: user.email, name: 'New Name', isAdmin: true });
	});

	it('a deleted sessions row (signed out elsewhere, password reset) ends the session', async () => {
		const user = await makeUser();
		const a = await signIn(user.id);
		const b = await signIn(user.id);
		expect(await endAllSessions(user.id)).toBe(2);
		expect(await jwt({ token: a })).toBeNull();
		expect(await jwt({ token: b })).toBeNull();
	});

	it('an expired session ends and its row is removed', async () => {
		const user = await makeUser();
		const token = await signIn(user.id);
		await db('sessions').where({ session_token: token.sid }).update({ expires: new Date(Date.now() - 1000) });
		expect(await jwt({ token })).toBeNull();
		expect(await db('sessions').where({ session_token: token.sid }).first()).toBeUndefined();
	});

	it('a session used after a day of quiet gets its end moved forward; a fresh one does not', async () => {
		const user = await makeUser();
		const token = await signIn(user.id);
		const before = (await db('sessions').where({ session_token: token.sid }).first()).expires.getTime();
		await jwt({ token });
		expect((await db('sessions').where({ session_token: token.sid }).first()).expires.getTime()).toBe(before);

		const aged = new Date(Date.now() + (LIFETIMES.session - LIFETIMES.sessionRefresh - 60) * 1000);
		await db('sessions').where({ session_token: token.sid }).update({ expires: aged });
		await jwt({ token });
		const moved = (await db('sessions').where({ session_token: token.sid }).first()).expires.getTime();
		expect(moved).toBeGreaterThan(aged.getTime() + (LIFETIMES.sessionRefresh - 120) * 1000);
	});

	it('a deleted user, a token without a session id, or a forged id end the session', async () => {
		const user = await makeUser();
		const token = await signIn(user.id);
		await users.destroy(user.id);
		expect(await jwt({ token })).toBeNull();
		expect(await jwt({ token: { sub: '1' } })).toBeNull();
		expect(await jwt({ token: { sub: '1', sid: 'made-up' } })).toBeNull();
	});

	it('signing out deletes the row', async () => {
		const user = await makeUser();
		const token = await signIn(user.id);
		await config.events!.signOut!({ token });
		expect(await db('sessions').where({ session_token: token.sid }).first()).toBeUndefined();
	});

	it('userFromSession refuses anything but a well-formed user', () => {
		expect(userFromSession(null)).toBeNull();
		expect(userFromSession({ user: { name: 'x' } })).toBeNull();
		expect(userFromSession({ chromaslate: { id: '3', email: 'a@b.test' } })).toBeNull();
		expect(userFromSession({ chromaslate: { id: 0, email: 'a@b.test' } })).toBeNull();
		expect(userFromSession({ chromaslate: { id: 3, email: 'a@b.test', name: 'A', isAdmin: 'yes' } })).toEqual({
			id: 3,
			email: 'a@b.test',
			name: 'A',
			isAdmin: false
		});
	});
});
