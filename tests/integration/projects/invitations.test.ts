import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as invitations from '$lib/server/db/invitations';
import * as members from '$lib/server/db/members';
import { closeMail } from '$lib/server/mail';
import { loadProjectFor } from '$lib/server/authz';
import { checkPassword, signUpWithInvitation } from '$lib/server/services/auth';
import { acceptInvitation, invite, listPendingInvitations, readInvitation } from '$lib/server/services/projects';
import * as invitePage from '../../../src/routes/invite/[token]/+page.server';
import { makeUser, uniqueEmail, uniqueIp } from '../auth/helpers/factories';
import { linkIn, waitForMail } from '../auth/helpers/mail';
import { fakeEvent, makeCrew, ORIGIN, outcome, sessionUser } from './helpers';

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

async function ownerAccess() {
	const crew = await makeCrew('Night Wash pickups (test)');
	return { crew, access: await loadProjectFor(sessionUser(crew.byRole.owner), crew.project.id) };
}

async function inviteAndRead(email: string, role: 'gaffer' | 'colorist' | 'dp' = 'gaffer') {
	const { crew, access } = await ownerAccess();
	const since = new Date();
	const result = await invite(access, { email, role }, ORIGIN);
	expect(result.ok).toBe(true);
	const mail = await waitForMail(email, { subject: /invited you/, since });
	const link = linkIn(mail, '/invite/');
	return { crew, access, mail, link, token: new URL(link).pathname.split('/').pop()! };
}

describe('invitations', () => {
	it('the owner invites by e-mail: the mail names the inviter, project and role, in text and HTML', async () => {
		const email = uniqueEmail('new-gaffer');
		const { mail, link } = await inviteAndRead(email);
		expect(mail.mail.subject).toBe('Crew owner invited you to “Night Wash pickups (test)” on Chromaslate');
		expect(mail.mail.text).toContain('as gaffer');
		expect(mail.mail.text).toContain('within 7 days');
		expect(mail.mail.html).toContain(link);
		expect(link.startsWith(`${ORIGIN}/invite/`)).toBe(true);
	});

	it('only the SHA-256 of the token is stored', async () => {
		const email = uniqueEmail('hash');
		const { token, crew } = await inviteAndRead(email);
		const row = await db('invitations').where({ project_id: crew.project.id, email }).first();
		expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
		const [found] = await db.raw('SELECT COUNT(*) AS n FROM invitations WHERE token_hash = ?', [token]);
		expect(Number(found[0].n)).toBe(0);
	});

	it('a new person signs up through the link: account confirmed, on the project with the role, invitation used up', async () => {
		const email = uniqueEmail('joiner');
		const { token, crew } = await inviteAndRead(email, 'colorist');

		const page = await outcome(() => invitePage.load(fakeEvent({ user: null, path: `/invite/${token}`, params: { token } }) as never));
		expect(page).toMatchObject({ kind: 'ok', data: { invitation: { email, roleLabel: 'Colorist', projectName: 'Night Wash pickups (test)' }, user: null } });

		const made = await signUpWithInvitation(token, { name: 'Grading Suite', password: 'long enough password' });
		expect(made).toEqual({ ok: true, email, projectId: crew.project.id });
		const signIn = await checkPassword(email, 'long enough password', { origin: ORIGIN, ip: uniqueIp() });
		expect(signIn.ok).toBe(true);
		const userId = signIn.ok ? signIn.user.id : 0;
		expect(await members.readRole(crew.project.id, userId)).toBe('colorist');

		expect(await readInvitation(token)).toBeNull();
		expect(await signUpWithInvitation(token, { name: 'Again', password: 'long enough password' })).toEqual({ ok: false, reason: 'invitation' });
	});

	it('someone with an account signs in and accepts; the link then works no more', async () => {
		const person = await makeUser({ name: 'Board Op' });
		const { token, crew } = await inviteAndRead(person.email, 'dp');

		const signedOut = await outcome(() => invitePage.actions.accept(fakeEvent({ user: null, path: `/invite/${token}?/accept`, params: { token }, form: {} }) as never));
		expect(signedOut).toMatchObject({ kind: 'redirect', location: expect.stringMatching(/^\/sign-in\?redirectTo=%2Finvite%2F/) });

		const accepted = await outcome(() =>
			invitePage.actions.accept(fakeEvent({ user: sessionUser(person), path: `/invite/${token}?/accept`, params: { token }, form: {} }) as never)
		);
		expect(accepted).toEqual({ kind: 'redirect', location: `/projects/${crew.project.id}` });
		expect(await members.readRole(crew.project.id, person.id)).toBe('dp');
		expect(await acceptInvitation(token, sessionUser(person))).toEqual({ ok: false, reason: 'invalid' });
	});

	it('an invitation for one address cannot be taken by another account', async () => {
		const { token, crew } = await inviteAndRead(uniqueEmail('intended'));
		const other = await makeUser();
		const r = await outcome(() => invitePage.actions.accept(fakeEvent({ user: sessionUser(other), path: `/invite/${token}?/accept`, params: { token }, form: {} }) as never));
		expect(r).toMatchObject({ kind: 'fail', status: 400, data: { message: expect.stringMatching(/another address/) } });
		expect(await members.readRole(crew.project.id, other.id)).toBeNull();
		expect(await readInvitation(token)).not.toBeNull();
	});

	it('an expired invitation shows as gone and cannot be used', async () => {
		const email = uniqueEmail('late');
		const { token, crew } = await inviteAndRead(email);
		await db('invitations').where({ project_id: crew.project.id, email }).update({ expires_at: new Date(Date.now() - 1000) });
		expect(await readInvitation(token)).toBeNull();
		const page = await outcome(() => invitePage.load(fakeEvent({ user: null, path: `/invite/${token}`, params: { token } }) as never));
		expect(page).toMatchObject({ kind: 'ok', data: { invitation: null } });
		expect(await signUpWithInvitation(token, { name: 'Too Late', password: 'long enough password' })).toEqual({ ok: false, reason: 'invitation' });
	});

	it('an address that already has an account is asked to sign in instead of signing up', async () => {
		const person = await makeUser();
		const { token } = await inviteAndRead(person.email);
		expect(await signUpWithInvitation(token, { name: 'Dup', password: 'long enough password' })).toEqual({ ok: false, reason: 'exists' });
		expect(await readInvitation(token)).not.toBeNull();
	});

	it('inviting the same address again replaces the open invitation', async () => {
		const email = uniqueEmail('twice');
		const { access, token: first } = await inviteAndRead(email);
		const since = new Date();
		await invite(access, { email, role: 'dp' }, ORIGIN);
		const second = new URL(linkIn(await waitForMail(email, { since }), '/invite/')).pathname.split('/').pop()!;
		expect(await readInvitation(first)).toBeNull();
		expect((await readInvitation(second))?.role).toBe('dp');
		expect((await listPendingInvitations(access)).filter((i) => i.email === email)).toHaveLength(1);
	});

	it('someone already on the project keeps their role when accepting', async () => {
		const { crew, access } = await ownerAccess();
		const dp = crew.byRole.dp;
		// Invite directly (the form refuses members, but an invitation may predate joining another way).
		const { token } = await invitations.create({ projectId: crew.project.id, email: dp.email, role: 'viewer', invitedBy: access.user.id, ttlSeconds: 60 });
		expect(await acceptInvitation(token, sessionUser(dp))).toEqual({ ok: true, projectId: crew.project.id });
		expect(await members.readRole(crew.project.id, dp.id)).toBe('dp');
	});
});
