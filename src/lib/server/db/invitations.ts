/**
 * The `invitations` table: an owner asks someone, by e-mail, to join a project with a role. The link
 * carries a random token; only its SHA-256 is stored. An invitation is used once and expires.
 */
import type { Knex } from 'knex';
import { db } from './index';
import type { ProjectRole } from './members';
import { hashToken, randomToken } from './tokens';
import { normalizeEmail } from './users';

export interface Invitation {
	id: number;
	projectId: number;
	email: string;
	role: ProjectRole;
	expiresAt: Date;
	usedAt: Date | null;
	usedBy: number | null;
	invitedBy: number | null;
	createdAt: Date;
}

interface Row {
	id: number;
	project_id: number;
	email: string;
	role: ProjectRole;
	token_hash: string;
	expires_at: Date;
	used_at: Date | null;
	used_by: number | null;
	invited_by: number | null;
	created_at: Date;
}

const toInvitation = (r: Row): Invitation => ({
	id: r.id,
	projectId: r.project_id,
	email: r.email,
	role: r.role,
	expiresAt: r.expires_at,
	usedAt: r.used_at,
	usedBy: r.used_by,
	invitedBy: r.invited_by,
	createdAt: r.created_at
});

export interface NewInvitation {
	projectId: number;
	email: string;
	role: ProjectRole;
	invitedBy: number | null;
	ttlSeconds: number;
}

/** Stores the invitation and returns it with the plain token (for the link; never stored). */
export async function create(input: NewInvitation, q: Knex = db): Promise<{ invitation: Invitation; token: string }> {
	const token = randomToken();
	const now = new Date();
	const [id] = await q('invitations').insert({
		project_id: input.projectId,
		email: normalizeEmail(input.email),
		role: input.role,
		token_hash: hashToken(token),
		expires_at: new Date(now.getTime() + input.ttlSeconds * 1000),
		invited_by: input.invitedBy,
		created_at: now
	});
	const row = await q<Row>('invitations').where({ id: Number(id) }).first();
	if (!row) throw new Error(`invitations.create: row ${id} vanished after insert`);
	return { invitation: toInvitation(row), token };
}

export async function read(id: number, q: Knex = db): Promise<Invitation | null> {
	const row = await q<Row>('invitations').where({ id }).first();
	return row ? toInvitation(row) : null;
}

export async function readByToken(token: string, q: Knex = db): Promise<Invitation | null> {
	const row = await q<Row>('invitations').where({ token_hash: hashToken(token) }).first();
	return row ? toInvitation(row) : null;
}

export function isUsable(inv: Invitation | null, now = new Date()): inv is Invitation {
	return inv !== null && inv.usedAt === null && inv.expiresAt.getTime() > now.getTime();
}

/** Unused, unexpired invitations of a project, newest first. */
export async function listPending(projectId: number, now = new Date(), q: Knex = db): Promise<Invitation[]> {
	const rows = await q<Row>('invitations')
		.where({ project_id: projectId })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.orderBy('created_at', 'desc')
		.orderBy('id', 'desc');
	return rows.map(toInvitation);
}

/** Marks the invitation used by `userId`; false if it was already used or has expired (one conditional UPDATE). */
export async function markUsed(id: number, userId: number, q: Knex = db): Promise<boolean> {
	const now = new Date();
	const changed = await q('invitations')
		.where({ id })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.update({ used_at: now, used_by: userId });
	return changed === 1;
}

/** Removes one invitation of a project (revoking it). */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('invitations').where({ project_id: projectId, id }).delete()) === 1;
}

/** Removes the still-open invitations for an address on a project (before inviting it again). */
export async function destroyPending(projectId: number, email: string, q: Knex = db): Promise<number> {
	return q('invitations').where({ project_id: projectId, email: normalizeEmail(email) }).whereNull('used_at').delete();
}
