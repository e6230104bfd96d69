/**
 * Every project load and action, called as each role and as a stranger. The expected set of allowed
 * roles comes from the role table (PRODUCT notes, "Roles"), written out here rather than read from
 * authz.ts, so a change to the table has to change this test too.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as invitations from '$lib/server/db/invitations';
import * as members from '$lib/server/db/members';
import * as projects from '$lib/server/db/projects';
import { closeMail } from '$lib/server/mail';
import { PROJECT_ROLES, type ProjectRole } from '$lib/server/db/members';
import * as overview from '../../../src/routes/projects/[projectId]/+page.server';
import * as membersPage from '../../../src/routes/projects/[projectId]/members/+page.server';
import * as settingsPage from '../../../src/routes/projects/[projectId]/settings/+page.server';
import * as list from '../../../src/routes/projects/+page.server';
import * as accountPage from '../../../src/routes/account/+page.server';
import * as users from '$lib/server/db/users';
import * as create from '../../../src/routes/projects/new/+page.server';
import { uniqueEmail } from '../auth/helpers/factories';
import { fakeEvent, makeCrew, outcome, sessionUser, type Crew, type Outcome } from './helpers';

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

type Actor = ProjectRole | 'stranger';
const ACTORS: Actor[] = [...PROJECT_ROLES, 'stranger'];

interface Case {
	name: string;
	allowed: readonly ProjectRole[];
	path: (c: Crew) => string;
	form?: (c: Crew) => Record<string, string | number>;
	run: (event: ReturnType<typeof fakeEvent>) => unknown;
	/** For an allowed actor: the effect happened. For a refused one: it did not. */
	effect: (c: Crew) => Promise<boolean>;
}

const ALL = PROJECT_ROLES;
const OWNER = ['owner'] as const;
const LEAD = ['owner', 'dp'] as const;
const exists = async (c: Crew) => (await projects.read(c.project.id)) !== null;

const CASES: Case[] = [
	{
		name: 'overview (load)',
		allowed: ALL,
		path: (c) => `/projects/${c.project.id}`,
		run: (e) => overview.load(e as never),
		effect: async () => true
	},
	{
		name: 'archive',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}?/archive`,
		form: (c) => ({ version: c.project.version }),
		run: (e) => overview.actions.archive(e as never),
		effect: async (c) => (await projects.read(c.project.id))?.archivedAt != null
	},
	{
		name: 'restore',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}?/restore`,
		form: (c) => ({ version: c.project.version }),
		run: (e) => overview.actions.restore(e as never),
		effect: async (c) => (await projects.read(c.project.id))?.version === c.project.version + 1
	},
	{
		name: 'delete',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}?/delete`,
		form: (c) => ({ confirmName: c.project.name }),
		run: (e) => overview.actions.delete(e as never),
		effect: async (c) => !(await exists(c))
	},
	{
		name: 'settings (load)',
		allowed: LEAD,
		path: (c) => `/projects/${c.project.id}/settings`,
		run: (e) => settingsPage.load(e as never),
		effect: async () => true
	},
	{
		name: 'rename and edit notes (settings)',
		allowed: LEAD,
		path: (c) => `/projects/${c.project.id}/settings`,
		form: (c) => ({ name: 'Renamed in the matrix', notes: 'Invented.', version: c.project.version }),
		run: (e) => settingsPage.actions.default(e as never),
		effect: async (c) => (await projects.read(c.project.id))?.name === 'Renamed in the matrix'
	},
	{
		name: 'members (load)',
		allowed: ALL,
		path: (c) => `/projects/${c.project.id}/members`,
		run: (e) => membersPage.load(e as never),
		effect: async () => true
	},
	{
		name: 'invite',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}/members?/invite`,
		form: () => ({ email: uniqueEmail('matrix-invite'), role: 'gaffer' }),
		run: (e) => membersPage.actions.invite(e as never),
		effect: async (c) => (await invitations.listPending(c.project.id)).length === 2
	},
	{
		name: 'revoke an invitation',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}/members?/revoke`,
		form: (c) => ({ invitationId: c.invitationId }),
		run: (e) => membersPage.actions.revoke(e as never),
		effect: async (c) => (await invitations.read(c.invitationId)) === null
	},
	{
		name: 'change a role',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}/members?/role`,
		form: (c) => ({ userId: c.extra.id, role: 'colorist' }),
		run: (e) => membersPage.actions.role(e as never),
		effect: async (c) => (await members.readRole(c.project.id, c.extra.id)) === 'colorist'
	},
	{
		name: 'remove a member',
		allowed: OWNER,
		path: (c) => `/projects/${c.project.id}/members?/remove`,
		form: (c) => ({ userId: c.extra.id }),
		run: (e) => membersPage.actions.remove(e as never),
		effect: async (c) => (await members.readRole(c.project.id, c.extra.id)) === null
	}
];

function eventFor(c: Crew, actor: Actor | null, kase: Case) {
	const user = actor === null ? null : sessionUser(actor === 'stranger' ? c.stranger : c.byRole[actor]);
	return fakeEvent({ user, path: kase.path(c), params: { projectId: String(c.project.id) }, form: kase.form?.(c) });
}

const succeeded = (o: Outcome) => o.kind === 'ok' || (o.kind === 'redirect' && !o.location.startsWith('/sign-in'));

describe('project routes: each role and a stranger', () => {
	for (const kase of CASES) {
		describe(kase.name, () => {
			for (const actor of ACTORS) {
				const allowed = actor !== 'stranger' && kase.allowed.includes(actor);
				const expected = actor === 'stranger' ? 'is told the project does not exist (404)' : allowed ? 'may' : 'is refused (403)';
				it(`${actor} ${expected}`, async () => {
					const crew = await makeCrew();
					const result = await outcome(() => kase.run(eventFor(crew, actor, kase)));
					if (actor === 'stranger') expect(result).toEqual({ kind: 'error', status: 404 });
					else if (allowed) expect(succeeded(result), JSON.stringify(result)).toBe(true);
					else expect(result).toEqual({ kind: 'error', status: 403 });
					if (kase.name.endsWith('(load)')) return;
					expect(await kase.effect(crew)).toBe(allowed);
				});
			}
			it('someone signed out is sent to sign in, and comes back afterwards', async () => {
				const crew = await makeCrew();
				const result = await outcome(() => kase.run(eventFor(crew, null, kase)));
				expect(result.kind).toBe('redirect');
				const location = (result as { location: string }).location;
				expect(location.startsWith('/sign-in?redirectTo=')).toBe(true);
				expect(decodeURIComponent(location)).toContain(`/projects/${crew.project.id}`);
			});
		});
	}

	it('a project id that is malformed or unknown is a 404 for a signed-in user too', async () => {
		const crew = await makeCrew();
		for (const projectId of ['abc', '0', '-3', '1e3', '99999999', '4294967296']) {
			const e = fakeEvent({ user: sessionUser(crew.byRole.owner), path: `/projects/${projectId}`, params: { projectId } });
			expect(await outcome(() => overview.load(e as never))).toEqual({ kind: 'error', status: 404 });
		}
	});

	it('a site admin who is not on the project gets 404 like anyone else', async () => {
		const crew = await makeCrew();
		const admin = { ...sessionUser(crew.stranger), isAdmin: true };
		const e = fakeEvent({ user: admin, path: `/projects/${crew.project.id}`, params: { projectId: String(crew.project.id) } });
		expect(await outcome(() => overview.load(e as never))).toEqual({ kind: 'error', status: 404 });
	});
});

/**
 * Routes of one's own account, on no project: every role of a project and a stranger alike may use
 * them (each on their own account only), someone signed out is sent to sign in.
 */
const ACCOUNT_CASES: { name: string; path: string; form?: (me: { name: string }) => Record<string, string>; run: (e: ReturnType<typeof fakeEvent>) => unknown; effect: (id: number) => Promise<boolean> }[] = [
	{ name: 'account (load)', path: '/account', run: (e) => accountPage.load(e as never), effect: async () => true },
	{
		name: 'account ?/name',
		path: '/account?/name',
		form: (me) => ({ name: `${me.name} (renamed)` }),
		run: (e) => accountPage.actions.name(e as never),
		effect: async (id) => (await users.read(id))?.name.endsWith('(renamed)') === true
	}
];

describe('account routes: each role, a stranger, and nobody', () => {
	for (const kase of ACCOUNT_CASES) {
		it(`${kase.name}: every signed-in person on their own account; nobody is sent to sign in`, async () => {
			const crew = await makeCrew();
			for (const actor of ACTORS) {
				const me = actor === 'stranger' ? crew.stranger : crew.byRole[actor];
				const result = await outcome(() => kase.run(fakeEvent({ user: sessionUser(me), path: kase.path, form: kase.form?.(me) })));
				expect(result.kind, `${actor}: ${JSON.stringify(result)}`).toBe('ok');
				expect(await kase.effect(me.id), actor).toBe(true);
			}
			const out = await outcome(() => kase.run(fakeEvent({ user: null, path: kase.path, form: kase.form?.({ name: 'x' }) })));
			expect(out).toEqual({ kind: 'redirect', location: `/sign-in?${new URLSearchParams({ redirectTo: kase.path })}` });
		});
	}
	it('covers every action of the account page', () => {
		expect(Object.keys(accountPage.actions).sort()).toEqual(['name', 'password']);
	});

	it('account ?/password: signed out is sent to sign in; signed in reaches the check of the current password', async () => {
		const crew = await makeCrew();
		const form = { currentPassword: 'wrong one here', newPassword: 'a long enough new one', repeatPassword: 'a long enough new one' };
		for (const actor of ACTORS) {
			const me = actor === 'stranger' ? crew.stranger : crew.byRole[actor];
			const r = await outcome(() => accountPage.actions.password(fakeEvent({ user: sessionUser(me), path: '/account?/password', form }) as never));
			// makeCrew's people sign in by e-mail link only: each is told to set a password by reset link.
			expect(r, actor).toMatchObject({ kind: 'fail', status: 400 });
		}
		const out = await outcome(() => accountPage.actions.password(fakeEvent({ user: null, path: '/account?/password', form }) as never));
		expect(out).toEqual({ kind: 'redirect', location: '/sign-in?redirectTo=%2Faccount%3F%2Fpassword' });
	});
});

describe('project rules beyond one role', () => {
	it('the overview shows name, your role and the members', async () => {
		const crew = await makeCrew('Overview check');
		const e = fakeEvent({ user: sessionUser(crew.byRole.gaffer), path: `/projects/${crew.project.id}`, params: { projectId: String(crew.project.id) } });
		const r = await outcome(() => overview.load(e as never));
		const data = (r as { data: { project: { name: string }; role: string; roleLabel: string; members: { name: string }[]; permissions: string[] } }).data;
		expect(data.project.name).toBe('Overview check');
		expect(data.role).toBe('gaffer');
		expect(data.roleLabel).toBe('Gaffer');
		expect(data.members.map((m) => m.name).sort()).toEqual(['Crew colorist', 'Crew dp', 'Crew gaffer', 'Crew owner', 'Crew viewer', 'Extra viewer']);
		expect(data.permissions).toContain('reading.edit');
		expect(data.permissions).not.toContain('target.lock');
	});

	it('archiving with an old version is refused as a conflict (409) and changes nothing', async () => {
		const crew = await makeCrew();
		await projects.update(crew.project.id, crew.project.version, { name: 'Renamed meanwhile' });
		const e = fakeEvent({
			user: sessionUser(crew.byRole.owner),
			path: `/projects/${crew.project.id}?/archive`,
			params: { projectId: String(crew.project.id) },
			form: { version: crew.project.version }
		});
		const r = await outcome(() => overview.actions.archive(e as never));
		expect(r).toMatchObject({ kind: 'fail', status: 409 });
		expect((await projects.read(crew.project.id))?.archivedAt).toBeNull();
	});

	it('deleting needs the exact name typed', async () => {
		const crew = await makeCrew('Type me exactly');
		const e = fakeEvent({
			user: sessionUser(crew.byRole.owner),
			path: `/projects/${crew.project.id}?/delete`,
			params: { projectId: String(crew.project.id) },
			form: { confirmName: 'type me exactly' }
		});
		expect(await outcome(() => overview.actions.delete(e as never))).toMatchObject({ kind: 'fail', status: 400 });
		expect(await projects.read(crew.project.id)).not.toBeNull();
	});

	it('the last owner can neither be demoted nor removed; with a second owner both work', async () => {
		const crew = await makeCrew();
		const owner = sessionUser(crew.byRole.owner);
		const ev = (action: string, form: Record<string, string | number>) =>
			fakeEvent({ user: owner, path: `/projects/${crew.project.id}/members?/${action}`, params: { projectId: String(crew.project.id) }, form });
		expect(await outcome(() => membersPage.actions.role(ev('role', { userId: owner.id, role: 'viewer' }) as never))).toMatchObject({ kind: 'fail', status: 400 });
		expect(await outcome(() => membersPage.actions.remove(ev('remove', { userId: owner.id }) as never))).toMatchObject({ kind: 'fail', status: 400 });
		expect(await members.readRole(crew.project.id, owner.id)).toBe('owner');

		expect((await outcome(() => membersPage.actions.role(ev('role', { userId: crew.byRole.dp.id, role: 'owner' }) as never))).kind).toBe('ok');
		expect((await outcome(() => membersPage.actions.role(ev('role', { userId: owner.id, role: 'gaffer' }) as never))).kind).toBe('ok');
		expect(await members.readRole(crew.project.id, owner.id)).toBe('gaffer');
	});

	it('inviting someone already on the project is refused; bad input refills the form', async () => {
		const crew = await makeCrew();
		const owner = sessionUser(crew.byRole.owner);
		const ev = (form: Record<string, string>) =>
			fakeEvent({ user: owner, path: `/projects/${crew.project.id}/members?/invite`, params: { projectId: String(crew.project.id) }, form });
		const again = await outcome(() => membersPage.actions.invite(ev({ email: crew.byRole.gaffer.email.toUpperCase(), role: 'viewer' }) as never));
		expect(again).toMatchObject({ kind: 'fail', status: 400, data: { issues: { email: [expect.stringMatching(/on the project already/)] } } });
		const bad = await outcome(() => membersPage.actions.invite(ev({ email: 'not an address', role: 'boss' }) as never));
		expect(bad).toMatchObject({ kind: 'fail', status: 400, data: { values: { email: 'not an address', role: 'boss' } } });
		const issues = (bad as { data: { issues: Record<string, string[]> } }).data.issues;
		expect(Object.keys(issues).sort()).toEqual(['email', 'role']);
	});

	it('only owners see addresses and open invitations on the members page', async () => {
		const crew = await makeCrew();
		const load = async (role: ProjectRole) => {
			const e = fakeEvent({ user: sessionUser(crew.byRole[role]), path: `/projects/${crew.project.id}/members`, params: { projectId: String(crew.project.id) } });
			return ((await outcome(() => membersPage.load(e as never))) as { data: { members: { email: string | null }[]; invitations: unknown[] } }).data;
		};
		const asOwner = await load('owner');
		expect(asOwner.invitations).toHaveLength(1);
		expect(asOwner.members.every((m) => m.email)).toBe(true);
		const asColorist = await load('colorist');
		expect(asColorist.invitations).toHaveLength(0);
		expect(asColorist.members.every((m) => m.email === null)).toBe(true);
	});
});

describe('the projects list and creating a project', () => {
	it('lists only the projects you are on, with your role', async () => {
		const crew = await makeCrew('Listed for the gaffer');
		const e = fakeEvent({ user: sessionUser(crew.byRole.gaffer), path: '/projects' });
		const data = ((await outcome(() => list.load(e as never))) as { data: { projects: { id: number; role: string }[] } }).data;
		expect(data.projects).toEqual([expect.objectContaining({ id: crew.project.id, role: 'gaffer', name: 'Listed for the gaffer', memberCount: 6 })]);
		const s = fakeEvent({ user: sessionUser(crew.stranger), path: '/projects' });
		const theirs = ((await outcome(() => list.load(s as never))) as { data: { projects: { name: string }[] } }).data.projects;
		expect(theirs.map((p) => p.name)).toEqual(['Some other show']);
	});

	it('signed out: the list and the new-project form send you to sign in', async () => {
		expect(await outcome(() => list.load(fakeEvent({ user: null, path: '/projects' }) as never))).toEqual({
			kind: 'redirect',
			location: '/sign-in?redirectTo=%2Fprojects'
		});
		const r = await outcome(() => create.actions.default(fakeEvent({ user: null, path: '/projects/new', form: { name: 'x' } }) as never));
		expect(r.kind).toBe('redirect');
	});

	it('creating a project makes you its owner and takes you there', async () => {
		const crew = await makeCrew();
		const me = sessionUser(crew.stranger);
		const r = await outcome(() => create.actions.default(fakeEvent({ user: me, path: '/projects/new', form: { name: '  Studio day  ', notes: 'Invented.' } }) as never));
		expect(r.kind).toBe('redirect');
		const id = Number((r as { location: string }).location.split('/').pop());
		expect((await projects.read(id))?.name).toBe('Studio day');
		expect(await members.readRole(id, me.id)).toBe('owner');
	});

	it('a project without a name is refused with the reason', async () => {
		const crew = await makeCrew();
		const r = await outcome(() => create.actions.default(fakeEvent({ user: sessionUser(crew.stranger), path: '/projects/new', form: { name: '   ', notes: 'keep me' } }) as never));
		expect(r).toMatchObject({ kind: 'fail', status: 400, data: { issues: { name: ['Give the project a name.'] }, values: { notes: 'keep me' } } });
	});
});
