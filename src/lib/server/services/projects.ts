/**
 * Projects, their members and invitations. Callers pass a `ProjectAccess` from `$lib/server/authz`
 * (which already checked membership and the permission); these functions enforce the rules that go
 * beyond one role, like "a project always keeps at least one owner".
 */
import { z } from 'zod';
import { db } from '$lib/server/db';
import * as activity from '$lib/server/db/activity';
import * as invitations from '$lib/server/db/invitations';
import * as members from '$lib/server/db/members';
import * as photoRows from '$lib/server/db/photos';
import * as projects from '$lib/server/db/projects';
import * as users from '$lib/server/db/users';
import type { Invitation } from '$lib/server/db/invitations';
import type { Member } from '$lib/server/db/members';
import type { MemberProject, Project } from '$lib/server/db/projects';
import { LIFETIMES } from '$lib/server/auth/policy';
import type { SessionUser } from '$lib/server/auth/types';
import { ROLE_LABELS, ROLES, type ProjectAccess, type Role } from '$lib/server/authz';
import { sendInvitation } from '$lib/server/mail';
import { emailField } from './auth';
import { changes, LogError, raiseConflict } from './log';
import { removeProjectObjects } from './photos';

export const projectSchema = z.object({
	name: z
		.string({ error: 'Give the project a name.' })
		.trim()
		.min(1, 'Give the project a name.')
		.max(160, 'Keep the name under 160 characters.'),
	notes: z.string().trim().max(5000, 'Keep the notes under 5000 characters.').optional().default('')
});

const roleField = z.enum(ROLES, { error: 'Pick one of the roles.' });
const userIdField = z.coerce.number({ error: 'Pick a member.' }).int().positive('Pick a member.');

export const inviteSchema = z.object({ email: emailField, role: roleField });
export const roleChangeSchema = z.object({ userId: userIdField, role: roleField });
export const memberSchema = z.object({ userId: userIdField });
export const versionSchema = z.object({ version: z.coerce.number().int().positive() });
export const deleteSchema = z.object({ confirmName: z.string().trim().min(1, 'Type the project’s name to confirm.') });
export const invitationIdSchema = z.object({ invitationId: z.coerce.number().int().positive() });

/** The project settings form: name and notes, with the version the person started from. */
export const projectSettingsSchema = projectSchema.extend({ version: z.coerce.number({ error: 'Reload the page and try again.' }).int().positive() });

/** The JSON API's `PATCH /api/v1/projects/:id`: the version, and any of name and notes. */
export const projectPatchSchema = z
	.object({ version: z.number().int().positive(), name: projectSchema.shape.name.optional(), notes: z.string().trim().max(5000, 'Keep the notes under 5000 characters.').optional() })
	.strict();

const PROJECT_LABELS = { name: 'Name', notes: 'Notes' } as const;

export function listMyProjects(user: SessionUser): Promise<MemberProject[]> {
	return projects.listForMember(user.id);
}

/** Makes the project with its creator as owner. */
export async function createProject(user: SessionUser, input: z.infer<typeof projectSchema>): Promise<Project> {
	return db.transaction(async (trx) => {
		const project = await projects.create({ name: input.name, notes: input.notes, createdBy: user.id }, trx);
		await members.create(project.id, user.id, 'owner', trx);
		return project;
	});
}

export type Conflict = { ok: false; reason: 'conflict' };

/** Archives (or, with `archived: false`, restores) the project if nobody changed it since `version`. */
export async function setArchived(access: ProjectAccess, archived: boolean, version: number): Promise<{ ok: true; project: Project } | Conflict> {
	const project = await projects.update(access.project.id, version, { archivedAt: archived ? new Date() : null, updatedBy: access.user.id });
	return project ? { ok: true, project } : { ok: false, reason: 'conflict' };
}

/** A project as the JSON API sends it. */
export function toApiProject(p: Project, role: Role) {
	return {
		id: p.id,
		name: p.name,
		notes: p.notes,
		archived: p.archivedAt !== null,
		archived_at: p.archivedAt,
		version: p.version,
		role,
		created_at: p.createdAt,
		updated_at: p.updatedAt
	};
}

function projectSummary(before: Project, ch: Record<string, [string, string]>): string {
	const renamed = ch.name ? `Renamed the project “${before.name}” to “${ch.name[1]}”` : null;
	if (renamed && ch.notes) return `${renamed} and changed its notes`;
	return renamed ?? 'Changed the project’s notes';
}

/**
 * Renames the project and/or changes its notes if nobody changed it since `version`. A stale
 * version throws `LogError('conflict')` saying who saved first and showing both versions; the change
 * is written to the activity log with its before and after. Saving what is already stored writes
 * nothing.
 */
export async function updateDetails(access: ProjectAccess, input: { name?: string; notes?: string }, version: number): Promise<Project> {
	if (!access.can('project.edit')) throw new LogError('forbidden', 'Your role on this project cannot change its name or notes.');
	const id = access.project.id;
	const patch: { name?: string; notes?: string } = {};
	if (input.name !== undefined) patch.name = input.name.trim();
	if (input.notes !== undefined) patch.notes = input.notes.trim();
	return db.transaction(async (trx) => {
		const current = await projects.read(id, trx);
		if (!current) throw new LogError('not_found', 'There is no such project, or you are not on it.');
		if (current.version !== version) return raiseConflict('project', PROJECT_LABELS, patch, current);
		const ch = changes(PROJECT_LABELS, current as unknown as Record<string, unknown>, patch);
		if (Object.keys(ch).length === 0) return current;
		const updated = await projects.update(id, version, { ...patch, updatedBy: access.user.id }, trx);
		if (!updated) {
			const now = await projects.read(id, trx);
			if (!now) throw new LogError('not_found', 'There is no such project, or you are not on it.');
			return raiseConflict('project', PROJECT_LABELS, patch, now);
		}
		await activity.create(id, { userId: access.user.id, action: 'project.update', subjectType: 'project', subjectId: id, summary: projectSummary(current, ch), details: { changes: ch } }, trx);
		return updated;
	});
}

/**
 * Deletes the project and everything in it, once the owner typed its name: the rows (the database
 * cascades from the project) and then its photos' objects in storage (originals, thumbnails,
 * unfinished uploads). Once the rows are gone nobody can reach the objects, so a storage failure
 * is logged rather than undoing the delete.
 */
export async function deleteProject(access: ProjectAccess, confirmName: string): Promise<{ ok: true } | { ok: false; reason: 'name' }> {
	if (confirmName.trim() !== access.project.name.trim()) return { ok: false, reason: 'name' };
	const id = access.project.id;
	const keys = await photoRows.keysOf(id);
	await projects.destroy(id);
	try {
		await removeProjectObjects(id, keys);
	} catch (e) {
		console.warn(`[projects] stored photos of deleted project ${id} were not all removed:`, e);
	}
	return { ok: true };
}

export function listMembers(access: ProjectAccess): Promise<Member[]> {
	return members.list(access.project.id);
}

export function listPendingInvitations(access: ProjectAccess): Promise<Invitation[]> {
	return invitations.listPending(access.project.id);
}

/**
 * Invites an address with a role and mails the link. An earlier open invitation for the same address
 * is replaced. Someone already on the project is not invited again.
 */
export async function invite(
	access: ProjectAccess,
	input: z.infer<typeof inviteSchema>,
	origin: string
): Promise<{ ok: true; invitation: Invitation } | { ok: false; reason: 'member' }> {
	const existing = await users.readByEmail(input.email);
	if (existing && (await members.readRole(access.project.id, existing.id))) return { ok: false, reason: 'member' };
	const { invitation, token } = await db.transaction(async (trx) => {
		await invitations.destroyPending(access.project.id, input.email, trx);
		return invitations.create(
			{ projectId: access.project.id, email: input.email, role: input.role, invitedBy: access.user.id, ttlSeconds: LIFETIMES.invitation },
			trx
		);
	});
	await sendInvitation(invitation.email, {
		inviterName: access.user.name || access.user.email,
		projectName: access.project.name,
		roleLabel: ROLE_LABELS[input.role],
		url: `${origin}/invite/${token}`,
		lifetimeSeconds: LIFETIMES.invitation
	});
	return { ok: true, invitation };
}

export function revokeInvitation(access: ProjectAccess, invitationId: number): Promise<boolean> {
	return invitations.destroy(access.project.id, invitationId);
}

export type MemberChange = { ok: true } | { ok: false; reason: 'not-member' | 'last-owner' };

/** Changes a member's role; the last owner cannot stop being one. */
export async function changeRole(access: ProjectAccess, userId: number, role: Role): Promise<MemberChange> {
	return db.transaction(async (trx) => {
		const current = await members.readRole(access.project.id, userId, trx);
		if (!current) return { ok: false as const, reason: 'not-member' as const };
		if (current === 'owner' && role !== 'owner' && (await members.countOwners(access.project.id, trx)) <= 1) {
			return { ok: false as const, reason: 'last-owner' as const };
		}
		await members.update(access.project.id, userId, role, trx);
		return { ok: true as const };
	});
}

/** Takes someone off the project; the last owner cannot be removed. */
export async function removeMember(access: ProjectAccess, userId: number): Promise<MemberChange> {
	return db.transaction(async (trx) => {
		const current = await members.readRole(access.project.id, userId, trx);
		if (!current) return { ok: false as const, reason: 'not-member' as const };
		if (current === 'owner' && (await members.countOwners(access.project.id, trx)) <= 1) {
			return { ok: false as const, reason: 'last-owner' as const };
		}
		await members.destroy(access.project.id, userId, trx);
		return { ok: true as const };
	});
}

export interface InvitationView {
	email: string;
	role: Role;
	roleLabel: string;
	projectName: string;
	inviterName: string;
	expiresAt: Date;
}

/** What an invitation link shows, or null when it is unknown, used or expired. */
export async function readInvitation(token: string): Promise<InvitationView | null> {
	const invitation = await invitations.readByToken(token);
	if (!invitations.isUsable(invitation)) return null;
	const project = await projects.read(invitation.projectId);
	if (!project) return null;
	const inviter = invitation.invitedBy ? await users.read(invitation.invitedBy) : null;
	return {
		email: invitation.email,
		role: invitation.role,
		roleLabel: ROLE_LABELS[invitation.role],
		projectName: project.name,
		inviterName: inviter ? inviter.name || inviter.email : 'A Chromaslate user',
		expiresAt: invitation.expiresAt
	};
}

export type Acceptance = { ok: true; projectId: number } | { ok: false; reason: 'invalid' | 'other-address' };

/**
 * Joins the signed-in user to the project, if the invitation is still good and was sent to their
 * address. Someone already on the project keeps the role they have.
 */
export async function acceptInvitation(token: string, user: SessionUser): Promise<Acceptance> {
	return db.transaction(async (trx) => {
		const invitation = await invitations.readByToken(token, trx);
		if (!invitations.isUsable(invitation)) return { ok: false as const, reason: 'invalid' as const };
		if (invitation.email !== users.normalizeEmail(user.email)) return { ok: false as const, reason: 'other-address' as const };
		if (!(await invitations.markUsed(invitation.id, user.id, trx))) return { ok: false as const, reason: 'invalid' as const };
		if (!(await members.readRole(invitation.projectId, user.id, trx))) {
			await members.create(invitation.projectId, user.id, invitation.role, trx);
		}
		return { ok: true as const, projectId: invitation.projectId };
	});
}
