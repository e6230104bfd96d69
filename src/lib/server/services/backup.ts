/**
 * Project backup and restore. A backup is one JSON document with everything of the project: its
 * shoot days, setups (targets, locks), circuits, lights (removed ones too), uploaded files (bytes
 * as base64), saved column mappings, readings with their raw input and computed values, accepted
 * fixes, comments and the activity log. People are referred to by e-mail address, rows by their
 * ids in the source database (references inside the file use those ids).
 *
 * Restoring makes a new project whose only member is the person restoring it (owner). Rows are
 * written exactly as backed up (versions, authors, times, computed values and their computation
 * version), which the table modules' verbs deliberately do not allow (they stamp "now" and version
 * 1), so this module writes the rows itself, inside one transaction: all or nothing. Authors are
 * matched by e-mail to accounts on this instance; unknown people become "unknown" (null).
 * Members of the original project are listed in the file but not added to the new one.
 */
import type { Knex } from 'knex';
import { z } from 'zod';
import { COMPUTATION_VERSION } from '$lib/colour';
import { db } from '$lib/server/db';
import { parseJson } from '$lib/server/db/json';
import * as members from '$lib/server/db/members';
import * as projects from '$lib/server/db/projects';
import { dateOnly } from '$lib/server/db/shoot-days';
import type { SessionUser } from '$lib/server/auth/types';
import type { ProjectAccess } from '$lib/server/authz';
import { LogError } from './log';

export const BACKUP_FORMAT = 'chromaslate-project-backup';
export const BACKUP_FORMAT_VERSION = 1;

type Row = Record<string, unknown>;

interface TableSpec {
	name: string;
	/** Columns holding JSON documents. */
	json: string[];
	/** Columns holding a user id (written as e-mail in the file). */
	users: string[];
	/** Columns referring to another backed-up table. */
	refs: Record<string, string>;
	/** A `subject_type` + `subject_id` pair pointing at one of several tables. */
	subject?: Record<string, string>;
}

const STAMPED = ['created_by', 'updated_by'];

/** In restore order: every table after the ones it refers to. */
export const BACKUP_TABLES: readonly TableSpec[] = [
	{ name: 'shoot_days', json: [], users: STAMPED, refs: {} },
	{ name: 'setups', json: ['target'], users: [...STAMPED, 'target_locked_by', 'locked_by'], refs: { shoot_day_id: 'shoot_days' } },
	{ name: 'circuits', json: [], users: STAMPED, refs: { setup_id: 'setups' } },
	{ name: 'lights', json: ['gel_stack', 'led_settings'], users: STAMPED, refs: { setup_id: 'setups', circuit_id: 'circuits' } },
	{ name: 'uploads', json: ['mapping', 'report'], users: ['uploaded_by'], refs: {} },
	{ name: 'column_mappings', json: ['mapping'], users: STAMPED, refs: {} },
	{ name: 'readings', json: ['raw', 'analysis'], users: [...STAMPED, 'deleted_by'], refs: { setup_id: 'setups', light_id: 'lights', upload_id: 'uploads' } },
	{ name: 'accepted_fixes', json: ['fix', 'predicted', 'target'], users: ['accepted_by'], refs: { setup_id: 'setups', light_id: 'lights' } },
	{ name: 'comments', json: [], users: ['author_id'], refs: {}, subject: { setup: 'setups', light: 'lights', reading: 'readings' } },
	{
		name: 'activity',
		json: ['details'],
		users: ['user_id'],
		refs: {},
		subject: { shoot_day: 'shoot_days', setup: 'setups', light: 'lights', circuit: 'circuits', reading: 'readings', comment: 'comments', fix: 'accepted_fixes' }
	}
];

export interface ProjectBackup {
	format: typeof BACKUP_FORMAT;
	formatVersion: number;
	exportedAt: string;
	computationVersion: string;
	project: { name: string; notes: string };
	members: { email: string; name: string; role: string }[];
	tables: Record<string, Row[]>;
}

function encodeValue(v: unknown, column: string, spec: TableSpec, emails: Map<number, string>): unknown {
	if (v === null || v === undefined) return null;
	if (spec.users.includes(column)) return emails.get(v as number) ?? null;
	if (spec.json.includes(column)) return parseJson(v);
	if (column === 'shoot_date') return dateOnly(v);
	if (v instanceof Date) return v.toISOString();
	if (Buffer.isBuffer(v)) return { base64: v.toString('base64') };
	if (typeof v === 'bigint') return Number(v);
	return v;
}

/** The whole project as one JSON-ready document. */
export async function backupProject(access: ProjectAccess): Promise<ProjectBackup> {
	if (!access.can('export.create')) throw new LogError('forbidden', 'Your role on this project cannot export it.');
	const projectId = access.project.id;
	const raw: Record<string, Row[]> = {};
	for (const t of BACKUP_TABLES) raw[t.name] = await db(t.name).where({ project_id: projectId }).orderBy('id');
	const ids = new Set<number>();
	for (const t of BACKUP_TABLES) for (const r of raw[t.name]) for (const c of t.users) if (r[c] != null) ids.add(r[c] as number);
	const people = ids.size ? await db('users').whereIn('id', [...ids]).select('id', 'email') : [];
	const emails = new Map<number, string>(people.map((u: Row) => [u.id as number, u.email as string]));
	const tables: Record<string, Row[]> = {};
	for (const t of BACKUP_TABLES) {
		tables[t.name] = raw[t.name].map((r) => {
			const out: Row = {};
			for (const [k, v] of Object.entries(r)) if (k !== 'project_id') out[k] = encodeValue(v, k, t, emails);
			out.id = Number(r.id);
			return out;
		});
	}
	const memberList = await members.list(projectId);
	return {
		format: BACKUP_FORMAT,
		formatVersion: BACKUP_FORMAT_VERSION,
		exportedAt: new Date().toISOString(),
		computationVersion: COMPUTATION_VERSION,
		project: { name: access.project.name, notes: access.project.notes },
		members: memberList.map((m) => ({ email: m.email, name: m.name, role: m.role })),
		tables
	};
}

const rowSchema = z.record(z.string(), z.unknown()).refine((r) => Number.isInteger(r.id) && (r.id as number) > 0, 'Every row needs a positive id.');

export const backupSchema = z.object({
	format: z.literal(BACKUP_FORMAT, { error: 'This is not a Chromaslate project backup.' }),
	formatVersion: z.literal(BACKUP_FORMAT_VERSION, { error: `This backup was made by another version of Chromaslate (format ${BACKUP_FORMAT_VERSION} expected).` }),
	exportedAt: z.string().optional(),
	computationVersion: z.string().optional(),
	project: z.object({ name: z.string().trim().min(1).max(160), notes: z.string().max(5000).nullish() }),
	members: z.array(z.object({ email: z.string(), name: z.string().optional(), role: z.string() })).optional().default([]),
	tables: z.record(z.string(), z.array(rowSchema))
});

/** Reads a backup file's text; throws LogError('invalid') with a sentence when it is not one. */
export function parseBackup(text: string): z.infer<typeof backupSchema> {
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		throw new LogError('invalid', 'That file is not JSON: choose a Chromaslate project backup (.json).');
	}
	const r = backupSchema.safeParse(body);
	if (!r.success) throw new LogError('invalid', r.error.issues[0]?.message ?? 'That file is not a Chromaslate project backup.');
	return r.data;
}

interface ColumnInfo {
	name: string;
	type: string;
}

async function columnsOf(trx: Knex.Transaction, table: string): Promise<ColumnInfo[]> {
	const [rows] = await trx.raw('SELECT COLUMN_NAME AS name, DATA_TYPE AS type FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ?', [table]);
	return (rows as { name: string; type: string }[]).map((r) => ({ name: r.name, type: r.type.toLowerCase() }));
}

function remapTarget(target: unknown, readingIds: Map<number, number>): unknown {
	const t = target as { kind?: string; readingId?: number } | null;
	if (t && t.kind === 'reading' && typeof t.readingId === 'number') {
		const id = readingIds.get(t.readingId);
		return id ? { ...t, readingId: id } : null;
	}
	return target;
}

/**
 * Restores a backup as a new project owned by `user`; returns its id. With `name`, the new
 * project is called that instead of the backed-up name.
 */
export async function restoreProject(user: SessionUser, backup: z.infer<typeof backupSchema>, { name }: { name?: string } = {}): Promise<number> {
	return db.transaction(async (trx) => {
		const project = await projects.create({ name: name?.trim() || backup.project.name, notes: backup.project.notes ?? '', createdBy: user.id }, trx);
		await members.create(project.id, user.id, 'owner', trx);
		const emails = new Set<string>();
		for (const t of BACKUP_TABLES) for (const r of backup.tables[t.name] ?? []) for (const c of t.users) if (typeof r[c] === 'string') emails.add((r[c] as string).toLowerCase());
		const people = emails.size ? await trx('users').whereIn('email', [...emails]).select('id', 'email') : [];
		const userIds = new Map<string, number>(people.map((u: Row) => [(u.email as string).toLowerCase(), u.id as number]));
		const idMaps = new Map<string, Map<number, number>>(BACKUP_TABLES.map((t) => [t.name, new Map()]));
		const pendingTargets: { table: string; id: number; column: string; value: unknown }[] = [];

		for (const t of BACKUP_TABLES) {
			const columns = (await columnsOf(trx, t.name)).filter((c) => c.name !== 'id' && c.name !== 'project_id');
			const map = idMaps.get(t.name)!;
			const rows = [...(backup.tables[t.name] ?? [])].sort((a, b) => (a.id as number) - (b.id as number));
			for (const r of rows) {
				const out: Row = { project_id: project.id };
				for (const c of columns) {
					if (!(c.name in r)) continue;
					let v = r[c.name];
					if (v !== null && v !== undefined) {
						if (t.users.includes(c.name)) v = typeof v === 'string' ? (userIds.get(v.toLowerCase()) ?? null) : null;
						// A reference to a row that is not in the backup becomes null (refused below where required).
						else if (c.name in t.refs) v = idMaps.get(t.refs[c.name])!.get(v as number) ?? null;
						else if (t.json.includes(c.name)) v = JSON.stringify(v);
						else if (c.type.includes('blob')) v = Buffer.from(String((v as { base64?: string }).base64 ?? ''), 'base64');
						else if (c.type === 'datetime' || c.type === 'timestamp') v = new Date(v as string);
					}
					out[c.name] = v;
				}
				if (t.subject && typeof r.subject_type === 'string' && r.subject_id != null) {
					const target = t.subject[r.subject_type];
					out.subject_id = target ? (idMaps.get(target)!.get(r.subject_id as number) ?? null) : r.subject_type === 'project' ? project.id : null;
					if (out.subject_id === null && t.name === 'comments') continue; // a comment on something not in the backup
				}
				const readingTarget = (t.name === 'setups' || t.name === 'accepted_fixes') && (r.target as { kind?: string } | null)?.kind === 'reading';
				if (readingTarget) out.target = null;
				let newId: number;
				try {
					[newId] = await trx(t.name).insert(out);
				} catch (e) {
					throw new LogError('invalid', `The backup’s ${t.name} row ${r.id} could not be restored: ${(e as Error).message.split('\n')[0]}`);
				}
				map.set(r.id as number, Number(newId));
				if (readingTarget) pendingTargets.push({ table: t.name, id: Number(newId), column: 'target', value: r.target });
			}
		}
		// Targets that name a reading, now that readings have their new ids.
		const readingIds = idMaps.get('readings')!;
		for (const p of pendingTargets) {
			await trx(p.table).where({ id: p.id }).update({ [p.column]: JSON.stringify(remapTarget(p.value, readingIds)) });
		}
		await trx('activity').insert({
			project_id: project.id,
			user_id: user.id,
			action: 'project.restore',
			subject_type: 'project',
			subject_id: project.id,
			summary: `Restored from a backup of “${backup.project.name}”${backup.exportedAt ? ` made ${backup.exportedAt.slice(0, 16).replace('T', ' ')} UTC` : ''}`
		});
		return project.id;
	});
}
