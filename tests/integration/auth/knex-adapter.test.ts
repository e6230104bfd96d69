import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createKnexAdapter, parseUserId, readSessionWithUser, type KnexAdapter } from '$lib/server/auth/knex-adapter';
import { testKnex } from '../helpers/db';
import { uniqueEmail } from './helpers/factories';

let knex: Knex;
let adapter: KnexAdapter;

beforeAll(async () => {
	knex = testKnex();
	await knex.migrate.latest();
	adapter = createKnexAdapter(knex);
});
afterAll(async () => {
	await knex.destroy();
});

const later = (seconds: number) => new Date(Math.floor(Date.now() / 1000) * 1000 + seconds * 1000);

async function newUser(name = 'Adapter Person') {
	// Auth.js hands createUser a made-up UUID; we ignore it and use our own id.
	return adapter.createUser({ id: crypto.randomUUID(), email: uniqueEmail('adapter'), emailVerified: null, name });
}

describe('Knex adapter: users', () => {
	it('createUser stores a normalised address and returns our integer id as a string', async () => {
		const email = uniqueEmail('Mixed.Case');
		const u = await adapter.createUser({ id: 'ignored-uuid', email: `  ${email.toUpperCase()} `, emailVerified: null, name: 'Spot Op' });
		expect(u.id).toMatch(/^[1-9][0-9]*$/);
		expect(u.email).toBe(email.toLowerCase());
		expect(u.name).toBe('Spot Op');
		expect(u.emailVerified).toBeNull();
	});

	it('getUser finds by id, and finds nothing for an id that is not ours', async () => {
		const u = await newUser();
		expect((await adapter.getUser(u.id))?.email).toBe(u.email);
		expect(await adapter.getUser('999999999')).toBeNull();
		expect(await adapter.getUser(crypto.randomUUID())).toBeNull();
		expect(await adapter.getUser('')).toBeNull();
	});

	it('getUserByEmail ignores case and surrounding spaces', async () => {
		const u = await newUser();
		expect((await adapter.getUserByEmail(` ${u.email.toUpperCase()} `))?.id).toBe(u.id);
		expect(await adapter.getUserByEmail(uniqueEmail('nobody'))).toBeNull();
	});

	it('updateUser changes the given fields only (emailVerified as a Date)', async () => {
		const u = await newUser('Before');
		const when = new Date('2026-11-30T21:15:00.250Z');
		const updated = await adapter.updateUser({ id: u.id, emailVerified: when });
		expect(updated.emailVerified?.toISOString()).toBe(when.toISOString());
		expect(updated.name).toBe('Before');
		const renamed = await adapter.updateUser({ id: u.id, name: 'After' });
		expect(renamed.name).toBe('After');
		expect(renamed.emailVerified?.toISOString()).toBe(when.toISOString());
	});

	it('updateUser throws for an unknown user', async () => {
		await expect(adapter.updateUser({ id: '999999998', name: 'x' })).rejects.toThrow(/No user/);
	});

	it('deleteUser removes the user with their accounts and sessions', async () => {
		const u = await newUser();
		await adapter.linkAccount({ userId: u.id, type: 'oauth', provider: 'example', providerAccountId: `del-${u.id}` });
		await adapter.createSession({ sessionToken: `del-${u.id}`, userId: u.id, expires: later(3600) });
		const gone = await adapter.deleteUser(u.id);
		expect(gone && 'email' in gone ? gone.email : null).toBe(u.email);
		expect(await adapter.getUser(u.id)).toBeNull();
		expect(await adapter.getUserByAccount({ provider: 'example', providerAccountId: `del-${u.id}` })).toBeNull();
		expect(await adapter.getSessionAndUser(`del-${u.id}`)).toBeNull();
	});
});

describe('Knex adapter: accounts', () => {
	it('linkAccount then getUserByAccount; unlinkAccount removes the link', async () => {
		const u = await newUser();
		const account = {
			userId: u.id,
			type: 'oidc' as const,
			provider: 'example-idp',
			providerAccountId: `acct-${u.id}`,
			access_token: 'at',
			refresh_token: 'rt',
			expires_at: 1_900_000_000,
			token_type: 'bearer' as const,
			scope: 'openid email',
			id_token: 'idt'
		};
		await adapter.linkAccount(account);
		expect((await adapter.getUserByAccount({ provider: 'example-idp', providerAccountId: `acct-${u.id}` }))?.id).toBe(u.id);
		const row = await knex('accounts').where({ provider: 'example-idp', provider_account_id: `acct-${u.id}` }).first();
		expect(row).toMatchObject({ access_token: 'at', refresh_token: 'rt', expires_at: 1_900_000_000, scope: 'openid email' });

		const removed = await adapter.unlinkAccount({ provider: 'example-idp', providerAccountId: `acct-${u.id}` });
		expect(removed && 'userId' in removed ? removed.userId : null).toBe(u.id);
		expect(await adapter.getUserByAccount({ provider: 'example-idp', providerAccountId: `acct-${u.id}` })).toBeNull();
		expect(await adapter.unlinkAccount({ provider: 'example-idp', providerAccountId: `acct-${u.id}` })).toBeUndefined();
	});

	it('refuses a second link of the same provider account', async () => {
		const u = await newUser();
		const link = { userId: u.id, type: 'oauth' as const, provider: 'example', providerAccountId: `dup-${u.id}` };
		await adapter.linkAccount(link);
		await expect(adapter.linkAccount(link)).rejects.toThrow(/Duplicate/);
	});
});

describe('Knex adapter: sessions', () => {
	it('createSession, getSessionAndUser, updateSession, deleteSession', async () => {
		const u = await newUser();
		const token = `sess-${crypto.randomUUID()}`;
		const expires = later(3600);
		const created = await adapter.createSession({ sessionToken: token, userId: u.id, expires });
		expect(created).toEqual({ sessionToken: token, userId: u.id, expires });

		const found = await adapter.getSessionAndUser(token);
		expect(found?.session.expires.getTime()).toBe(expires.getTime());
		expect(found?.user.email).toBe(u.email);

		const moved = later(7200);
		const updated = await adapter.updateSession({ sessionToken: token, expires: moved });
		expect(updated?.expires.getTime()).toBe(moved.getTime());

		const deleted = await adapter.deleteSession(token);
		expect(deleted && 'sessionToken' in deleted ? deleted.sessionToken : null).toBe(token);
		expect(await adapter.getSessionAndUser(token)).toBeNull();
		expect(await adapter.deleteSession(token)).toBeNull();
		expect(await adapter.updateSession({ sessionToken: token, expires: moved })).toBeNull();
	});

	it('returns an expired session as it is (the caller decides), and deleteUserSessions ends them all', async () => {
		const u = await newUser();
		await adapter.createSession({ sessionToken: `old-${u.id}`, userId: u.id, expires: later(-60) });
		await adapter.createSession({ sessionToken: `new-${u.id}`, userId: u.id, expires: later(60) });
		expect((await adapter.getSessionAndUser(`old-${u.id}`))?.session.expires.getTime()).toBeLessThan(Date.now());
		expect((await readSessionWithUser(knex, `new-${u.id}`))?.user.id).toBe(Number(u.id));
		expect(await adapter.deleteUserSessions(u.id)).toBe(2);
		expect(await adapter.getSessionAndUser(`new-${u.id}`)).toBeNull();
		expect(await readSessionWithUser(knex, `new-${u.id}`)).toBeNull();
	});

	it('createSession for an id that is not ours throws', async () => {
		await expect(adapter.createSession({ sessionToken: 'x', userId: 'not-a-number', expires: later(60) })).rejects.toThrow();
	});
});

describe('Knex adapter: verification tokens', () => {
	it('useVerificationToken returns the token once, then null (single use)', async () => {
		const identifier = uniqueEmail('link');
		const vt = { identifier, token: `hashed-${crypto.randomUUID()}`, expires: later(1800) };
		expect(await adapter.createVerificationToken(vt)).toEqual(vt);
		const used = await adapter.useVerificationToken({ identifier, token: vt.token });
		expect(used).toEqual(vt);
		expect(await adapter.useVerificationToken({ identifier, token: vt.token })).toBeNull();
	});

	it('does not hand out a token for another identifier', async () => {
		const vt = { identifier: uniqueEmail('a'), token: `hashed-${crypto.randomUUID()}`, expires: later(1800) };
		await adapter.createVerificationToken(vt);
		expect(await adapter.useVerificationToken({ identifier: uniqueEmail('b'), token: vt.token })).toBeNull();
		expect(await adapter.useVerificationToken({ identifier: vt.identifier, token: vt.token })).toEqual(vt);
	});

	it('two concurrent uses: exactly one gets the token', async () => {
		const vt = { identifier: uniqueEmail('race'), token: `hashed-${crypto.randomUUID()}`, expires: later(1800) };
		await adapter.createVerificationToken(vt);
		const results = await Promise.all([
			adapter.useVerificationToken({ identifier: vt.identifier, token: vt.token }),
			adapter.useVerificationToken({ identifier: vt.identifier, token: vt.token })
		]);
		expect(results.filter(Boolean)).toHaveLength(1);
	});

	it('an expired token is still returned once (Auth.js checks expiry itself) and removed', async () => {
		const vt = { identifier: uniqueEmail('old'), token: `hashed-${crypto.randomUUID()}`, expires: later(-5) };
		await adapter.createVerificationToken(vt);
		expect((await adapter.useVerificationToken(vt))?.expires.getTime()).toBe(vt.expires.getTime());
		expect(await knex('verification_tokens').where({ token: vt.token }).first()).toBeUndefined();
	});
});

describe('parseUserId', () => {
	it('accepts positive integers only', () => {
		expect(parseUserId('42')).toBe(42);
		expect(parseUserId(7)).toBe(7);
		for (const bad of ['0', '-1', '1.5', '01', 'abc', '', null, undefined, '12345678901']) expect(parseUserId(bad)).toBeNull();
	});
});
