/** Fake request events for calling route loads and actions directly, and a project with one member per role. */
import { isActionFailure, isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import * as invitations from '../../../src/lib/server/db/invitations';
import * as members from '../../../src/lib/server/db/members';
import * as projects from '../../../src/lib/server/db/projects';
import { PROJECT_ROLES, type ProjectRole } from '../../../src/lib/server/db/members';
import type { Project } from '../../../src/lib/server/db/projects';
import type { User } from '../../../src/lib/server/db/users';
import type { SessionUser } from '../../../src/lib/server/auth/types';
import { makeUser, uniqueEmail } from '../auth/helpers/factories';

export const ORIGIN = 'http://127.0.0.1:3999';

export function sessionUser(u: User): SessionUser {
	return { id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin };
}

export function fakeEvent(opts: {
	user: SessionUser | null;
	path: string;
	params?: Record<string, string>;
	form?: Record<string, string | number>;
}): RequestEvent {
	const url = new URL(opts.path, ORIGIN);
	const body = opts.form ? new URLSearchParams(Object.entries(opts.form).map(([k, v]) => [k, String(v)])) : undefined;
	const request = new Request(url, { method: body ? 'POST' : 'GET', body, headers: { origin: ORIGIN } });
	const jar = new Map<string, string>();
	return {
		locals: { user: opts.user, theme: 'dark' } as App.Locals,
		params: opts.params ?? {},
		url,
		request,
		route: { id: null },
		getClientAddress: () => '203.0.113.50',
		cookies: {
			get: (n: string) => jar.get(n),
			getAll: () => [...jar].map(([name, value]) => ({ name, value })),
			set: (n: string, v: string) => void jar.set(n, v),
			delete: (n: string) => void jar.delete(n),
			serialize: () => ''
		},
		setHeaders: () => {},
		fetch,
		isDataRequest: false,
		isSubRequest: false,
		isRemoteRequest: false,
		platform: undefined,
		tracing: { enabled: false, root: {}, current: {} }
	} as unknown as RequestEvent;
}

export type Outcome = { kind: 'ok'; data: unknown } | { kind: 'fail'; status: number; data: unknown } | { kind: 'redirect'; location: string } | { kind: 'error'; status: number };

/** Runs a load or action and says how it ended, the way SvelteKit would see it. */
export async function outcome(run: () => unknown): Promise<Outcome> {
	try {
		const r = await run();
		if (isActionFailure(r)) return { kind: 'fail', status: r.status, data: r.data };
		return { kind: 'ok', data: r };
	} catch (e) {
		if (isRedirect(e)) return { kind: 'redirect', location: e.location };
		if (isHttpError(e)) return { kind: 'error', status: e.status };
		throw e;
	}
}

export interface Crew {
	project: Project;
	byRole: Record<ProjectRole, User>;
	stranger: User;
	/** A second viewer, for the member actions to act on. */
	extra: User;
	invitationId: number;
}

/** A project with one member per role, an extra viewer, an open invitation, and a stranger who is on another project. */
export async function makeCrew(name = 'Laundromat pickups'): Promise<Crew> {
	const byRole = {} as Record<ProjectRole, User>;
	for (const role of PROJECT_ROLES) byRole[role] = await makeUser({ name: `Crew ${role}`, password: null });
	const project = await projects.create({ name, notes: 'Invented test project.', createdBy: byRole.owner.id });
	for (const role of PROJECT_ROLES) await members.create(project.id, byRole[role].id, role);
	const extra = await makeUser({ name: 'Extra viewer', password: null });
	await members.create(project.id, extra.id, 'viewer');
	const stranger = await makeUser({ name: 'Stranger', password: null });
	const elsewhere = await projects.create({ name: 'Some other show', createdBy: stranger.id });
	await members.create(elsewhere.id, stranger.id, 'owner');
	const { invitation } = await invitations.create({
		projectId: project.id,
		email: uniqueEmail('pending'),
		role: 'viewer',
		invitedBy: byRole.owner.id,
		ttlSeconds: 3600
	});
	return { project, byRole, stranger, extra, invitationId: invitation.id };
}
