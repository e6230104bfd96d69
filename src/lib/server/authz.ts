/**
 * Who may do what. One table maps each project role to its permissions; every action and API route
 * asks it through `can`, `loadProjectFor` or `requireProjectPermission`. Layouts never guard.
 *
 * Someone who is not on a project is told it does not exist (404, never 403), so project ids reveal
 * nothing. A member whose role lacks a permission gets 403: they already know the project exists.
 * A site admin manages accounts and the shared library; being an admin gives no access to projects.
 */
import { error, redirect } from '@sveltejs/kit';
import * as members from '$lib/server/db/members';
import * as projects from '$lib/server/db/projects';
import { PROJECT_ROLES, type ProjectRole } from '$lib/server/db/members';
import type { Project } from '$lib/server/db/projects';
import type { SessionUser } from '$lib/server/auth/types';

export type Role = ProjectRole;
export const ROLES = PROJECT_ROLES;

export const PERMISSIONS = [
	// see the project, its log, readings, photos
	'project.view',
	// comment
	'comment.create',
	// export CSV / report
	'export.create',
	// add and edit lights, readings, photos, power plan
	'light.edit',
	'reading.edit',
	'photo.edit',
	'power.edit',
	// ask for fixes, accept a fix
	'fix.request',
	'fix.accept',
	// set or lock a target white, lock a setup
	'target.set',
	'target.lock',
	'setup.lock',
	// invite and change members
	'member.invite',
	'member.change',
	// rename the project and edit its notes
	'project.edit',
	// archive or delete the project
	'project.archive',
	'project.delete'
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const VIEW = ['project.view'] as const;
const REVIEW = [...VIEW, 'comment.create', 'export.create'] as const;
const CREW = [...REVIEW, 'light.edit', 'reading.edit', 'photo.edit', 'power.edit', 'fix.request', 'fix.accept'] as const;
const LEAD = [...CREW, 'target.set', 'target.lock', 'setup.lock', 'project.edit'] as const;

/**
 * The role table. Owner: everything. DP: everything but members and the project's fate (the DP may
 * rename the project and edit its notes, as part of leading the look; archiving and deleting stay
 * with the owner).
 */
export const ROLE_PERMISSIONS: Readonly<Record<Role, ReadonlySet<Permission>>> = {
	owner: new Set<Permission>([...LEAD, 'member.invite', 'member.change', 'project.archive', 'project.delete']),
	dp: new Set<Permission>(LEAD),
	gaffer: new Set<Permission>(CREW),
	colorist: new Set<Permission>(REVIEW),
	viewer: new Set<Permission>(VIEW)
};

/** Plain-language names of the roles, for screens and mail. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
	owner: 'Owner',
	dp: 'Director of photography',
	gaffer: 'Gaffer',
	colorist: 'Colorist',
	viewer: 'Viewer'
};

export function can(role: Role | null | undefined, permission: Permission): boolean {
	return role != null && (ROLE_PERMISSIONS[role]?.has(permission) ?? false);
}

/** The permissions of a role, in the order of `PERMISSIONS` (handy to send to a page). */
export function permissionsOf(role: Role): Permission[] {
	return PERMISSIONS.filter((p) => ROLE_PERMISSIONS[role].has(p));
}

export type SitePermission = 'account.manage' | 'library.manage';

export function canSite(user: SessionUser | null | undefined, _permission: SitePermission): boolean {
	return user?.isAdmin === true;
}

/** A project as one member may use it. */
export interface ProjectAccess {
	project: Project;
	role: Role;
	user: SessionUser;
	permissions: Permission[];
	can(permission: Permission): boolean;
}

/** The signed-in user, or a redirect to the sign-in page that comes back to `url` afterwards. */
export function requireUser(locals: App.Locals, url: URL): SessionUser {
	if (locals.user) return locals.user;
	redirect(303, `/sign-in?${new URLSearchParams({ redirectTo: url.pathname + url.search })}`);
}

/** For JSON routes: the signed-in user, or 401. */
export function requireApiUser(locals: App.Locals): SessionUser {
	if (locals.user) return locals.user;
	error(401, { message: 'Sign in first.', code: 'unauthenticated' });
}

/** Project ids in URLs are positive integers; anything else is a project that does not exist. */
export function parseProjectId(raw: string | number | undefined): number | null {
	const s = String(raw ?? '');
	if (!/^[1-9][0-9]{0,9}$/.test(s)) return null;
	const n = Number(s);
	return n <= 4_294_967_295 ? n : null;
}

const NOT_FOUND = { message: 'There is no such project, or you are not on it.', code: 'project_not_found' };

/**
 * Loads the project for a member. Throws 404 when the id is malformed, the project does not exist or
 * the user is not on it: all three look the same from outside.
 */
export async function loadProjectFor(user: SessionUser, projectId: string | number | undefined): Promise<ProjectAccess> {
	const id = parseProjectId(projectId);
	if (id === null) error(404, NOT_FOUND);
	const role = await members.readRole(id, user.id);
	if (!role) error(404, NOT_FOUND);
	const project = await projects.read(id);
	if (!project) error(404, NOT_FOUND);
	return { project, role, user, permissions: permissionsOf(role), can: (p) => can(role, p) };
}

/** `loadProjectFor`, then 403 when the member's role lacks the permission. */
export async function requireProjectPermission(
	user: SessionUser,
	projectId: string | number | undefined,
	permission: Permission
): Promise<ProjectAccess> {
	const access = await loadProjectFor(user, projectId);
	if (!access.can(permission)) {
		error(403, { message: `A ${ROLE_LABELS[access.role].toLowerCase()} on this project cannot do that.`, code: 'forbidden' });
	}
	return access;
}

/**
 * The usual first line of a project page's load or action: signed in (else to the sign-in page),
 * on the project in `params.projectId` (else 404), and allowed `permission` (else 403).
 */
export async function projectAccess(
	event: { locals: App.Locals; url: URL; params: Partial<Record<string, string>> },
	permission: Permission = 'project.view'
): Promise<ProjectAccess> {
	const user = requireUser(event.locals, event.url);
	return requireProjectPermission(user, event.params.projectId, permission);
}
