import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as users from '$lib/server/db/users';
import { closeMail } from '$lib/server/mail';
import { verifyPassword } from '$lib/server/auth/password';
import {
	checkPassword,
	confirmEmail,
	confirmationIsUsable,
	passwordUser,
	requestPasswordReset,
	resetIsUsable,
	resetPassword,
	signUp
} from '$lib/server/services/auth';
import { createKnexAdapter } from '$lib/server/auth/knex-adapter';
import { linkIn, mailTo, waitForMail } from './helpers/mail';
import { makeUser, TEST_PASSWORD, uniqueEmail, uniqueIp } from './helpers/factories';

const ORIGIN = 'http://127.0.0.1:3999';
const ctx = () => ({ origin: ORIGIN, ip: uniqueIp() });
const tokenOf = (link: string) => new URL(link).pathname.split('/').pop()!;

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

describe('sign-up, confirmation and the password check', () => {
	it('sign-up mails a confirmation link (text and HTML), which confirms the address once', async () => {
		const email = uniqueEmail('signup');
		const since = new Date();
		expect(await signUp({ name: 'Best Boy Electric', email, password: TEST_PASSWORD }, ctx())).toEqual({ ok: true });

		const mail = await waitForMail(email, { subject: /Confirm your address/, since });
		expect(mail.mail.text).toContain('Hello Best Boy Electric,');
		expect(mail.mail.html).toContain('Confirm my address');
		const link = linkIn(mail, '/verify/');
		expect(link.startsWith(`${ORIGIN}/verify/`)).toBe(true);
		// The link survived quoted-printable encoding intact: the same URL is in the HTML part.
		expect(mail.mail.html).toContain(link);

		const before = await checkPassword(email, TEST_PASSWORD, ctx());
		expect(before).toEqual({ ok: false, reason: 'unconfirmed' });

		const token = tokenOf(link);
		expect(await confirmationIsUsable(token)).toBe(true);
		expect(await confirmEmail(token)).toEqual({ ok: true, email });
		expect(await confirmationIsUsable(token)).toBe(false);
		expect(await confirmEmail(token)).toEqual({ ok: false });

		const after = await checkPassword(email, TEST_PASSWORD, ctx());
		expect(after.ok && after.user.email).toBe(email);
		expect(await passwordUser(email, TEST_PASSWORD)).toMatchObject({ email });
	});

	it('the stored token is a SHA-256 hash, not the token from the mail', async () => {
		const email = uniqueEmail('hashed');
		const since = new Date();
		await signUp({ name: 'Hash Check', email, password: TEST_PASSWORD }, ctx());
		const token = tokenOf(linkIn(await waitForMail(email, { since }), '/verify/'));
		const user = await users.readByEmail(email);
		const row = await db('user_tokens').where({ user_id: user!.id }).first();
		expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
		expect(row.token_hash).not.toContain(token);
		const { createHash } = await import('node:crypto');
		expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
	});

	it('an unconfirmed account that signs in with the right password gets a fresh link', async () => {
		const user = await makeUser({ verified: false });
		const since = new Date();
		expect(await checkPassword(user.email, TEST_PASSWORD, ctx())).toEqual({ ok: false, reason: 'unconfirmed' });
		await waitForMail(user.email, { subject: /Confirm your address/, since });
	});

	it('signing up with an address that has an account changes nothing and mails its owner', async () => {
		const user = await makeUser({ name: 'Key Grip' });
		const since = new Date();
		expect(await signUp({ name: 'Somebody Else', email: user.email, password: 'another password here' }, ctx())).toEqual({ ok: true });
		const mail = await waitForMail(user.email, { since });
		expect(mail.mail.subject).toBe('You already have a Chromaslate account');
		expect(mail.mail.text).toContain(`${ORIGIN}/reset`);
		const after = await users.readWithPassword(user.email);
		expect(after?.name).toBe('Key Grip');
		expect(await verifyPassword(after?.passwordHash, TEST_PASSWORD)).toBe(true);
	});

	it('a wrong password and an unknown address give the same answer', async () => {
		const user = await makeUser();
		expect(await checkPassword(user.email, 'not the password', ctx())).toEqual({ ok: false, reason: 'invalid' });
		expect(await checkPassword(uniqueEmail('nobody'), TEST_PASSWORD, ctx())).toEqual({ ok: false, reason: 'invalid' });
		expect(await passwordUser(user.email, 'not the password')).toBeNull();
	});

	it('an account with no password (e-mail links only) cannot sign in with one', async () => {
		const user = await makeUser({ password: null });
		expect(await checkPassword(user.email, TEST_PASSWORD, ctx())).toEqual({ ok: false, reason: 'invalid' });
	});
});

describe('password reset', () => {
	it('mails a link for a known address; the link sets the password once and ends every session', async () => {
		const user = await makeUser({ name: 'Rigging Gaffer' });
		const adapter = createKnexAdapter(db);
		await adapter.createSession({ sessionToken: `reset-${user.id}`, userId: String(user.id), expires: new Date(Date.now() + 3600_000) });
		const since = new Date();
		expect(await requestPasswordReset(user.email.toUpperCase(), ctx())).toEqual({ ok: true });
		const mail = await waitForMail(user.email, { subject: /new Chromaslate password/, since });
		expect(mail.mail.html).toContain('Choose a new password');
		const token = tokenOf(linkIn(mail, '/reset/'));

		expect(await resetIsUsable(token)).toBe(true);
		expect(await resetPassword(token, 'a brand new password')).toEqual({ ok: true, email: user.email });
		expect(await resetIsUsable(token)).toBe(false);
		expect(await resetPassword(token, 'yet another password')).toEqual({ ok: false });

		expect(await adapter.getSessionAndUser(`reset-${user.id}`)).toBeNull();
		expect((await checkPassword(user.email, 'a brand new password', ctx())).ok).toBe(true);
		expect(await checkPassword(user.email, TEST_PASSWORD, ctx())).toEqual({ ok: false, reason: 'invalid' });
	});

	it('a reset confirms an unconfirmed address (the link proved it)', async () => {
		const user = await makeUser({ verified: false });
		const since = new Date();
		await requestPasswordReset(user.email, ctx());
		const token = tokenOf(linkIn(await waitForMail(user.email, { since }), '/reset/'));
		await resetPassword(token, 'confirmed by the reset');
		expect((await users.read(user.id))?.emailVerified).toBeInstanceOf(Date);
	});

	it('answers the same for an unknown address and sends nothing', async () => {
		const email = uniqueEmail('ghost');
		const since = new Date();
		expect(await requestPasswordReset(email, ctx())).toEqual({ ok: true });
		await new Promise((r) => setTimeout(r, 400));
		expect(await mailTo(email, since)).toEqual([]);
	});

	it('an expired reset link does nothing', async () => {
		const user = await makeUser();
		const since = new Date();
		await requestPasswordReset(user.email, ctx());
		const token = tokenOf(linkIn(await waitForMail(user.email, { since }), '/reset/'));
		await db('user_tokens').where({ user_id: user.id, purpose: 'reset-password' }).update({ expires_at: new Date(Date.now() - 1000) });
		expect(await resetIsUsable(token)).toBe(false);
		expect(await resetPassword(token, 'too late for this')).toEqual({ ok: false });
		expect((await checkPassword(user.email, TEST_PASSWORD, ctx())).ok).toBe(true);
	});

	it('a token for one purpose does not work for the other', async () => {
		const user = await makeUser();
		const since = new Date();
		await requestPasswordReset(user.email, ctx());
		const token = tokenOf(linkIn(await waitForMail(user.email, { since }), '/reset/'));
		expect(await confirmEmail(token)).toEqual({ ok: false });
		expect(await resetIsUsable(token)).toBe(true);
	});
});
