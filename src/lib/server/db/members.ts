/**
 * The `project_members` table: who is on a project and with which role. What each role may do is
 * decided in `$lib/server/authz`, not here.
 */
import type { Knex } from 'knex';
import { db } from './index';

/** In order of reach, widest first. */
export const PROJECT_ROLES = ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

export function isProjectRole(value: unknown): value is ProjectRole {
	return typeof value === 'string' && (PROJECT_ROLES as readonly string[]).includes(value);
}

export interface Member {
	projectId: number;
	userId: number;
	role: ProjectRole;
	name: string;
	email: string;
	joinedAt: Date;
}

interface Row {
	project_id: number;
	user_id: number;
	role: ProjectRole;
	name: string;
	email: string;
	created_at: Date;
}

const toMember = (r: Row): Member => ({
	projectId: r.project_id,
	userId: r.user_id,
	role: r.role,
	name: r.name,
	email: r.email,
	joinedAt: r.created_at
});

/** Members by role (owner first), then name. */
export async function list(projectId: number, q: Knex = db): Promise<Member[]> {
	const rows = await q('project_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.project_id', projectId)
		.select('m.project_id', 'm.user_id', 'm.role', 'm.created_at', 'u.name', 'u.email')
		.orderByRaw(`FIELD(m.role, ${PROJECT_ROLES.map(() => '?').join(', ')})`, [...PROJECT_ROLES])
		.orderBy('u.name')
		.orderBy('u.id');
	return rows.map(toMember);
}

export async function read(projectId: number, userId: number, q: Knex = db): Promise<Member | null> {
	const row = await q('project_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where({ 'm.project_id': projectId, 'm.user_id': userId })
		.first('m.project_id', 'm.user_id', 'm.role', 'm.created_at', 'u.name', 'u.email');
	return row ? toMember(row) : null;
}

/** The user's role on the project, or null when they are not on it. */
export async function readRole(projectId: number, userId: number, q: Knex = db): Promise<ProjectRole | null> {
	const row = await q('project_members').where({ project_id: projectId, user_id: userId }).first('role');
	return row ? (row.role as ProjectRole) : null;
}

/** Adds the member, or changes their role if they are already on the project. */
export async function create(projectId: number, userId: number, role: ProjectRole, q: Knex = db): Promise<void> {
	await q('project_members')
		.insert({ project_id: projectId, user_id: userId, role, created_at: new Date() })
		.onConflict(['project_id', 'user_id'])
		.merge(['role']);
}

export async function update(projectId: number, userId: number, role: ProjectRole, q: Knex = db): Promise<boolean> {
	return (await q('project_members').where({ project_id: projectId, user_id: userId }).update({ role })) === 1;
}

export async function destroy(projectId: number, userId: number, q: Knex = db): Promise<boolean> {
	return (await q('project_members').where({ project_id: projectId, user_id: userId }).delete()) === 1;
}

/** How many owners the project has, counting rows locked FOR UPDATE when `q` is a transaction. */
export async function countOwners(projectId: number, q: Knex = db): Promise<number> {
	const query = q('project_members').where({ project_id: projectId, role: 'owner' }).count({ n: '*' });
	const [row] = q.isTransaction ? await query.forUpdate() : await query;
	return Number(row?.n ?? 0);
}

/** Whether two people are members of at least one project together. */
export async function shareAProject(a: number, b: number, q: Knex = db): Promise<boolean> {
	const row = await q('project_members as x').join('project_members as y', 'y.project_id', 'x.project_id').where({ 'x.user_id': a, 'y.user_id': b }).first('x.project_id');
	return Boolean(row);
}
