/**
 * The `projects` table. `version` starts at 1 and goes up by one on every update; `update` takes the
 * version the caller last read and changes nothing if someone else got there first.
 */
import type { Knex } from 'knex';
import { db } from './index';
import type { ProjectRole } from './members';

export interface Project {
	id: number;
	name: string;
	notes: string;
	archivedAt: Date | null;
	createdBy: number | null;
	/** Who last changed the name, notes or archived state (null: nobody since it was made, or an account gone). */
	updatedBy: number | null;
	version: number;
	createdAt: Date;
	updatedAt: Date;
}

/** A project as one member sees it in a list. */
export interface MemberProject extends Project {
	role: ProjectRole;
	memberCount: number;
}

interface Row {
	id: number;
	name: string;
	notes: string | null;
	archived_at: Date | null;
	created_by: number | null;
	updated_by: number | null;
	version: number;
	created_at: Date;
	updated_at: Date;
}

function toProject(row: Row): Project {
	return {
		id: row.id,
		name: row.name,
		notes: row.notes ?? '',
		archivedAt: row.archived_at,
		createdBy: row.created_by,
		updatedBy: row.updated_by ?? null,
		version: row.version,
		createdAt: row.created_at,
		updatedAt: row.updated_at
	};
}

export async function read(id: number, q: Knex = db): Promise<Project | null> {
	const row = await q<Row>('projects').where({ id }).first();
	return row ? toProject(row) : null;
}

/** The projects a user is a member of, live ones first, then by name. */
export async function listForMember(userId: number, q: Knex = db): Promise<MemberProject[]> {
	const rows = await q('projects as p')
		.join('project_members as m', 'm.project_id', 'p.id')
		.where('m.user_id', userId)
		.select('p.*', 'm.role')
		.select(q.raw('(SELECT COUNT(*) FROM project_members c WHERE c.project_id = p.id) AS member_count'))
		.orderByRaw('p.archived_at IS NOT NULL')
		.orderBy('p.name')
		.orderBy('p.id');
	return rows.map((r: Row & { role: ProjectRole; member_count: number }) => ({
		...toProject(r),
		role: r.role,
		memberCount: Number(r.member_count)
	}));
}

export async function readByName(name: string, q: Knex = db): Promise<Project | null> {
	const row = await q<Row>('projects').where({ name }).orderBy('id').first();
	return row ? toProject(row) : null;
}

export interface NewProject {
	name: string;
	notes?: string;
	createdBy: number | null;
}

export async function create(input: NewProject, q: Knex = db): Promise<Project> {
	const now = new Date();
	const [id] = await q('projects').insert({
		name: input.name.trim(),
		notes: input.notes?.trim() || null,
		created_by: input.createdBy,
		created_at: now,
		updated_at: now
	});
	const project = await read(Number(id), q);
	if (!project) throw new Error(`projects.create: row ${id} vanished after insert`);
	return project;
}

export interface ProjectChanges {
	name?: string;
	notes?: string;
	archivedAt?: Date | null;
	/** Who is making the change. */
	updatedBy?: number | null;
}

/**
 * Applies the changes if the stored version is still `expectedVersion`, bumping it. Returns the
 * updated project, or null when the project is gone or its version moved on (reload and retry).
 */
export async function update(id: number, expectedVersion: number, changes: ProjectChanges, q: Knex = db): Promise<Project | null> {
	const row: Record<string, unknown> = { updated_at: new Date(), version: q.raw('version + 1') };
	if (changes.name !== undefined) row.name = changes.name.trim();
	if (changes.notes !== undefined) row.notes = changes.notes.trim() || null;
	if (changes.archivedAt !== undefined) row.archived_at = changes.archivedAt;
	if (changes.updatedBy !== undefined) row.updated_by = changes.updatedBy;
	const changed = await q('projects').where({ id, version: expectedVersion }).update(row);
	return changed === 1 ? read(id, q) : null;
}

export async function destroy(id: number, q: Knex = db): Promise<boolean> {
	return (await q('projects').where({ id }).delete()) > 0;
}
