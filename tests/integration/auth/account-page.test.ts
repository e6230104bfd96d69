/**
 * The account page: a signed-in person changes their display name and password (the current one
 * required, guesses counted), and sees their projects with their role on each. Signed out, it
 * sends you to sign in.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as members from '$lib/server/db/members';
import * as projects from '$lib/server/db/projects';
import * as users from '$lib/server/db/users';
import { verifyPassword } from '$lib/server/auth/password';
import { LIMITS } from '$lib/server/auth/policy';
import { createKnexAdapter } from '$lib/server/auth/knex-adapter';
import { closeMail } from '$lib/server/mail';
import * as account from '../../../src/routes/account/+page.server';
import { fakeEvent, outcome, sessionUser } from '../projects/helpers';
import { makeUser, TEST_PASSWORD } from './helpers/factories';

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

type Form = { valid: boolean; data: Record<string, string>; errors: Record<string, string[] | undefined>; message?: { tone: string; text: string } };
const adapter = createKnexAdapter(db);

function event(user: Awaited<ReturnType<typeof makeUser>> | null, action?: string, form?: Record<string, string>) {
	return fakeEvent({ user: user && sessionUser(user), path: action ? `/account?/${action}` : '/account', form });
}

async function run(action: 'name' | 'password', user: Awaited<ReturnType<typeof makeUser>>, form: Record<string, string>) {
	const e = event(user, action, form);
	const r = await outcome(() => account.actions[action](e as never));
	const data = (r as { data?: Record<string, Form> }).data ?? {};
	return { kind: r.kind, status: 'status' in r ? r.status : 200, form: Object.values(data)[0] as Form, cookies: e.cookies.getAll() };
}

async function sessionsOf(userId: number, n: number) {
	for (let i = 0; i < n; i++) await adapter.createSession({ sessionToken: `s-${userId}-${i}-${Date.now()}`, userId: String(userId), expires: new Date(Date.now() + 3600_000) });
}

describe('account page', () => {
	it('signed out: the page and both forms send you to sign in, and back here afterwards', async () => {
		expect(await outcome(() => account.load(event(null) as never))).toEqual({ kind: 'redirect', location: '/sign-in?redirectTo=%2Faccount' });
		for (const a of ['name', 'password'] as const) {
			const r = await outcome(() => account.actions[a](event(null, a, { name: 'x' }) as never));
			expect(r.kind).toBe('redirect');
			expect((r as { location: string }).location).toMatch(/^\/sign-in\?redirectTo=/);
		}
	});

	it('shows your name, address, whether you have a password, and your projects with your role', async () => {
		const me = await makeUser({ name: 'Board Op' });
		const a = await projects.create({ name: 'Account page A', createdBy: me.id });
		const b = await projects.create({ name: 'Account page B', createdBy: me.id });
		await members.create(a.id, me.id, 'gaffer');
		await members.create(b.id, me.id, 'viewer');
		await projects.update(b.id, b.version, { archivedAt: new Date() });
		const r = (await outcome(() => account.load(event(me) as never))) as { kind: string; data: Record<string, unknown> };
		expect(r.kind).toBe('ok');
		expect(r.data.account).toEqual({ name: 'Board Op', email: me.email });
		expect(r.data.hasPassword).toBe(true);
		expect((r.data.nameForm as Form).data).toEqual({ name: 'Board Op' });
		expect(r.data.projects).toEqual([
			{ id: a.id, name: 'Account page A', role: 'gaffer', roleLabel: 'Gaffer', archived: false, memberCount: 1 },
			{ id: b.id, name: 'Account page B', role: 'viewer', roleLabel: 'Viewer', archived: true, memberCount: 1 }
		]);
	});

	it('changes the display name; an empty one is refused on its field', async () => {
		const me = await makeUser({ name: 'Old Name' });
		const ok = await run('name', me, { name: '  Rigging Electric  ' });
		expect(ok.kind).toBe('ok');
		expect(ok.form.message).toEqual({ tone: 'good', text: 'Saved. The crew now sees you as Rigging Electric.' });
		expect((await users.read(me.id))?.name).toBe('Rigging Electric');
		const bad = await run('name', me, { name: '   ' });
		expect(bad).toMatchObject({ kind: 'fail', status: 400 });
		expect(bad.form.errors.name).toEqual(['Enter your name, as the crew knows you.']);
		expect((await users.read(me.id))?.name).toBe('Rigging Electric');
	});

	it('changes the password with the current one: other sessions end, this browser gets a new one, no password comes back', async () => {
		const me = await makeUser();
		await sessionsOf(me.id, 2);
		const r = await run('password', me, { currentPassword: TEST_PASSWORD, newPassword: 'generator behind the truck', repeatPassword: 'generator behind the truck' });
		expect(r.kind).toBe('ok');
		expect(r.form.message?.tone).toBe('good');
		expect(Object.values(r.form.data).every((v) => v === '')).toBe(true);
		const stored = await users.readWithPassword(me.email);
		expect(await verifyPassword(stored?.passwordHash, 'generator behind the truck')).toBe(true);
		expect(await verifyPassword(stored?.passwordHash, TEST_PASSWORD)).toBe(false);
		// The two old sessions are gone; the one just made for this browser is the only one left.
		const rows = await db('sessions').where({ user_id: me.id });
		expect(rows).toHaveLength(1);
		expect(rows[0].session_token).not.toMatch(/^s-/);
		expect(r.cookies.some((c) => c.name.includes('authjs.session-token') && c.value.length > 20)).toBe(true);
	});

	it('refuses a wrong current password, a mismatch and a short new one on their fields, changing nothing', async () => {
		const me = await makeUser();
		await sessionsOf(me.id, 1);
		const before = (await users.readWithPassword(me.email))?.passwordHash;
		const wrong = await run('password', me, { currentPassword: 'not my password', newPassword: 'generator behind the truck', repeatPassword: 'generator behind the truck' });
		expect(wrong).toMatchObject({ kind: 'fail', status: 400 });
		expect(wrong.form.errors.currentPassword).toEqual(['That is not your current password.']);
		expect(Object.values(wrong.form.data).every((v) => v === '')).toBe(true);
		const mismatch = await run('password', me, { currentPassword: TEST_PASSWORD, newPassword: 'generator behind the truck', repeatPassword: 'generator behind the van' });
		expect(mismatch.form.errors.repeatPassword).toEqual(['The two new passwords differ. Type them again.']);
		const short = await run('password', me, { currentPassword: TEST_PASSWORD, newPassword: 'short', repeatPassword: 'short' });
		expect(short.form.errors.newPassword).toEqual(['Use at least 10 characters.']);
		expect((await users.readWithPassword(me.email))?.passwordHash).toBe(before);
		expect(await db('sessions').where({ user_id: me.id })).toHaveLength(1);
	});

	it('counts guesses at the current password: past the limit even the right one waits', async () => {
		const me = await makeUser();
		for (let i = 0; i < LIMITS['password-change'].address.max; i++) {
			expect((await run('password', me, { currentPassword: `guess number ${i}`, newPassword: 'generator behind the truck', repeatPassword: 'generator behind the truck' })).status).toBe(400);
		}
		const limited = await run('password', me, { currentPassword: TEST_PASSWORD, newPassword: 'generator behind the truck', repeatPassword: 'generator behind the truck' });
		expect(limited.status).toBe(429);
		expect(limited.form.message?.text).toMatch(/^Too many tries/);
		expect(await verifyPassword((await users.readWithPassword(me.email))?.passwordHash, TEST_PASSWORD)).toBe(true);
	});

	it('an account that signs in by e-mail link is sent to set a password by reset link', async () => {
		const me = await makeUser({ password: null });
		const r = (await outcome(() => account.load(event(me) as never))) as { data: { hasPassword: boolean } };
		expect(r.data.hasPassword).toBe(false);
		const tried = await run('password', me, { currentPassword: 'anything at all', newPassword: 'generator behind the truck', repeatPassword: 'generator behind the truck' });
		expect(tried.status).toBe(400);
		expect(tried.form.message?.text).toMatch(/reset link/);
		expect((await users.readWithPassword(me.email))?.passwordHash).toBeNull();
	});
});
