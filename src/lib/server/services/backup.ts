/**
 * Project backup and restore. A backup is one JSON document with everything of the project: its
 * library (overrides of the built-in filters' figures, its own custom filters and fixture profiles,
 * with the files they were read from), shoot days, setups (targets, locks), circuits, lights
 * (removed ones too), uploaded readings files, saved column mappings, readings with their raw input
 * and computed values, accepted fixes, comments, photos and the activity log. Binary columns and
 * photos travel inside the file as base64: each ready photo with its cleaned original and its
 * thumbnail (`objects`), so a backup restores on its own, even once the project and its storage
 * are gone. Uploads still in progress are left out; refused ones keep their row (the reason) only.
 * People are referred to by e-mail address, rows by their ids in the source database (references
 * inside the file use those ids).
 *
 * Restoring makes a new project owned by the person restoring it. Rows are written exactly as
 * backed up (versions, authors, times, computed values and their computation version), which the
 * table modules' verbs deliberately do not allow (they stamp "now" and version 1), so this module
 * writes the rows itself, inside one transaction: all or nothing. References are rewritten to the
 * new ids, including custom filters named in gel stacks and fixes (`custom-<id>`) and the setup,
 * light, fix, reading or comment subject an activity entry names. Photos are checked again (type
 * from the bytes, location stripped if any) and written to storage under the new project; should
 * the restore fail, what was written is removed. Authors are matched by e-mail to accounts on this
 * instance; unknown people become "unknown" (null).
 *
 * The crew comes along only when asked (`keepMembers`). Then each member in the file takes the role
 * they had: someone whose account is already on a project with the restorer is added straight
 * away; everyone else is invited by e-mail to that address (the invitation works whether or not they
 * have an account yet, so a restore reveals nothing about who has one).
 */
import type { Knex } from 'knex';
import { z } from 'zod';
import { COMPUTATION_VERSION } from '$lib/colour';
import { db } from '$lib/server/db';
import * as invitations from '$lib/server/db/invitations';
import { parseJson } from '$lib/server/db/json';
import * as members from '$lib/server/db/members';
import { isProjectRole, type ProjectRole } from '$lib/server/db/members';
import * as projects from '$lib/server/db/projects';
import { dateOnly } from '$lib/server/db/shoot-days';
import * as users from '$lib/server/db/users';
import { LIFETIMES } from '$lib/server/auth/policy';
import type { SessionUser } from '$lib/server/auth/types';
import { ROLE_LABELS, type ProjectAccess } from '$lib/server/authz';
import { sendInvitation } from '$lib/server/mail';
import * as storage from '$lib/server/storage';
import { StorageConfigError } from '$lib/server/storage';
import { LogError } from './log';
import { finalKeys, incomingKey, MAX_PHOTO_BYTES, PhotoRejection, restoredPhoto } from './photos';

export const BACKUP_FORMAT = 'chromaslate-project-backup';
/** Format 1 throughout: files made before the library and photos were included restore as before. */
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
	/** Library rows: `scope_id` is the project's id (0 is the shared library, never backed up). */
	scoped?: boolean;
	/** JSON columns that may name a project's custom filter as `custom-<row id>`. */
	gelRefs?: string[];
	/** Columns that only mean something on this instance (object keys): left out of the file. */
	omit?: string[];
	/** Which of the project's rows are backed up (default: all). */
	only?: (q: Knex.QueryBuilder) => Knex.QueryBuilder;
}

const STAMPED = ['created_by', 'updated_by'];

/** In restore order: every table after the ones it refers to. */
export const BACKUP_TABLES: readonly TableSpec[] = [
	{ name: 'library_filter_overrides', json: [], users: STAMPED, refs: {} },
	{ name: 'library_custom_gels', json: ['transmission'], users: STAMPED, refs: {}, scoped: true, omit: ['scope_id'] },
	{ name: 'library_fixture_profiles', json: ['channels'], users: STAMPED, refs: {}, scoped: true, omit: ['scope_id'] },
	{ name: 'shoot_days', json: [], users: STAMPED, refs: {} },
	{ name: 'setups', json: ['target'], users: [...STAMPED, 'target_locked_by', 'locked_by'], refs: { shoot_day_id: 'shoot_days' } },
	{ name: 'circuits', json: [], users: STAMPED, refs: { setup_id: 'setups' } },
	{ name: 'lights', json: ['gel_stack', 'led_settings'], users: STAMPED, refs: { setup_id: 'setups', circuit_id: 'circuits' }, gelRefs: ['gel_stack'] },
	{ name: 'uploads', json: ['mapping', 'report'], users: ['uploaded_by'], refs: {} },
	{ name: 'column_mappings', json: ['mapping'], users: STAMPED, refs: {} },
	{ name: 'readings', json: ['raw', 'analysis'], users: [...STAMPED, 'deleted_by'], refs: { setup_id: 'setups', light_id: 'lights', upload_id: 'uploads' } },
	{ name: 'accepted_fixes', json: ['fix', 'predicted', 'target'], users: ['accepted_by'], refs: { setup_id: 'setups', light_id: 'lights' }, gelRefs: ['fix', 'predicted'] },
	{ name: 'comments', json: [], users: ['author_id'], refs: {}, subject: { setup: 'setups', light: 'lights', reading: 'readings' } },
	{
		name: 'photos',
		json: [],
		users: ['uploaded_by'],
		refs: { setup_id: 'setups', light_id: 'lights' },
		omit: ['incoming_key', 'original_key', 'thumbnail_key'],
		only: (q) => q.whereIn('status', ['ready', 'rejected'])
	},
	{
		name: 'activity',
		json: ['details'],
		users: ['user_id'],
		refs: {},
		subject: { shoot_day: 'shoot_days', setup: 'setups', light: 'lights', circuit: 'circuits', reading: 'readings', comment: 'comments', fix: 'accepted_fixes', photo: 'photos' },
		gelRefs: ['details']
	}
];

/** Ids an activity entry's details name, and the table each points into. */
const DETAIL_REFS: Record<string, string> = { setupId: 'setups', lightId: 'lights', fixId: 'accepted_fixes', readingId: 'readings' };
const COMMENT_SUBJECTS: Record<string, string> = { setup: 'setups', light: 'lights', reading: 'readings' };

export interface BackupMember {
	email: string;
	name: string;
	role: string;
}

export interface ProjectBackup {
	format: typeof BACKUP_FORMAT;
	formatVersion: number;
	exportedAt: string;
	computationVersion: string;
	project: { name: string; notes: string };
	members: BackupMember[];
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

const base64 = (bytes: Uint8Array) => ({ base64: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('base64') });

/** A ready photo's objects, read from storage (null for one that storage no longer has). */
async function photoObjects(row: Row): Promise<Row['objects']> {
	if (row.status !== 'ready' || typeof row.original_key !== 'string') return null;
	const original = await storage.read(row.original_key, MAX_PHOTO_BYTES);
	if (!original) return null;
	const thumbnail = typeof row.thumbnail_key === 'string' ? await storage.read(row.thumbnail_key, MAX_PHOTO_BYTES) : null;
	return { original: base64(original), thumbnail: thumbnail ? base64(thumbnail) : null };
}

/** The whole project as one JSON-ready document. */
export async function backupProject(access: ProjectAccess): Promise<ProjectBackup> {
	if (!access.can('export.create')) throw new LogError('forbidden', 'Your role on this project cannot export it.');
	const projectId = access.project.id;
	const raw: Record<string, Row[]> = {};
	for (const t of BACKUP_TABLES) {
		const q = db(t.name).where({ project_id: projectId });
		raw[t.name] = await (t.only ? t.only(q) : q).orderBy('id');
	}
	const ids = new Set<number>();
	for (const t of BACKUP_TABLES) for (const r of raw[t.name]) for (const c of t.users) if (r[c] != null) ids.add(r[c] as number);
	const people = ids.size ? await db('users').whereIn('id', [...ids]).select('id', 'email') : [];
	const emails = new Map<number, string>(people.map((u: Row) => [u.id as number, u.email as string]));
	const tables: Record<string, Row[]> = {};
	for (const t of BACKUP_TABLES) {
		tables[t.name] = [];
		for (const r of raw[t.name]) {
			const out: Row = {};
			for (const [k, v] of Object.entries(r)) if (k !== 'project_id' && !t.omit?.includes(k)) out[k] = encodeValue(v, k, t, emails);
			out.id = Number(r.id);
			if (t.name === 'photos') {
				const objects = await photoObjects(r);
				// A ready photo whose file storage lost cannot be restored; leave it out rather than break the file.
				if (r.status === 'ready' && !objects) continue;
				out.objects = objects;
			}
			tables[t.name].push(out);
		}
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
	members: z.array(z.object({ email: z.string(), name: z.string().optional(), role: z.string() })).max(500, 'A backup lists at most 500 members.').optional().default([]),
	tables: z.record(z.string(), z.array(rowSchema))
});

export type ParsedBackup = z.infer<typeof backupSchema>;

/** Reads a backup file's text; throws LogError('invalid') with a sentence when it is not one. */
export function parseBackup(text: string): ParsedBackup {
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

/** Every `custom-<old id>` string in a JSON value, for a custom filter restored with a new id. */
function remapGelIds(value: unknown, gelIds: Map<number, number>): unknown {
	if (typeof value === 'string') {
		const m = /^custom-(\d+)$/.exec(value);
		const id = m ? gelIds.get(Number(m[1])) : undefined;
		return id ? `custom-${id}` : value;
	}
	if (Array.isArray(value)) return value.map((v) => remapGelIds(v, gelIds));
	if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, remapGelIds(v, gelIds)]));
	return value;
}

/** The ids an activity entry's details name (a photo's setup and light, a fix, a comment's subject), rewritten. */
function remapDetails(details: unknown, idMaps: Map<string, Map<number, number>>): unknown {
	if (!details || typeof details !== 'object' || Array.isArray(details)) return details;
	const out: Row = { ...(details as Row) };
	for (const [key, table] of Object.entries(DETAIL_REFS)) {
		if (typeof out[key] === 'number') out[key] = idMaps.get(table)!.get(out[key] as number) ?? null;
	}
	const subjectTable = typeof out.subjectType === 'string' ? COMMENT_SUBJECTS[out.subjectType] : undefined;
	if (subjectTable && typeof out.subjectId === 'number') out.subjectId = idMaps.get(subjectTable)!.get(out.subjectId) ?? null;
	return out;
}

function bytesOf(v: unknown): Uint8Array | null {
	const b = (v as { base64?: unknown } | null)?.base64;
	return typeof b === 'string' && b.length > 0 ? new Uint8Array(Buffer.from(b, 'base64')) : null;
}

export interface RestoreOptions {
	/** The new project's name (default: the one in the backup). */
	name?: string;
	/** Bring the crew in the file along (see the module comment). */
	keepMembers?: boolean;
	/** The site's origin, for the links in invitations. */
	origin?: string;
}

export interface RestoreResult {
	projectId: number;
	/** Crew added straight away, with the role they had. */
	added: { email: string; role: ProjectRole }[];
	/** Crew invited by e-mail, with the role they had. */
	invited: { email: string; role: ProjectRole }[];
	/** Addresses whose invitation mail could not be sent (the invitation stands; resend from the members page). */
	mailFailed: string[];
}

/** The members in the file worth bringing: a valid address and role, each once, not the restorer. */
function crewToBring(backup: ParsedBackup, restorer: SessionUser): { email: string; role: ProjectRole }[] {
	const seen = new Set([users.normalizeEmail(restorer.email)]);
	const out: { email: string; role: ProjectRole }[] = [];
	for (const m of backup.members) {
		const email = users.normalizeEmail(m.email);
		if (seen.has(email) || !isProjectRole(m.role) || !z.email().safeParse(email).success) continue;
		seen.add(email);
		out.push({ email, role: m.role });
	}
	return out;
}

/**
 * Restores a backup as a new project owned by `user`. With `name`, the new project is called that
 * instead of the backed-up name; with `keepMembers`, the crew in the file comes along.
 */
export async function restoreProject(user: SessionUser, backup: ParsedBackup, { name, keepMembers = false, origin = '' }: RestoreOptions = {}): Promise<RestoreResult> {
	const written: string[] = [];
	const mails: { email: string; role: ProjectRole; token: string }[] = [];
	let result: Omit<RestoreResult, 'mailFailed'>;
	try {
		result = await db.transaction(async (trx) => {
			const project = await projects.create({ name: name?.trim() || backup.project.name, notes: backup.project.notes ?? '', createdBy: user.id }, trx);
			await members.create(project.id, user.id, 'owner', trx);
			const emails = new Set<string>();
			for (const t of BACKUP_TABLES) for (const r of backup.tables[t.name] ?? []) for (const c of t.users) if (typeof r[c] === 'string') emails.add((r[c] as string).toLowerCase());
			const people = emails.size ? await trx('users').whereIn('email', [...emails]).select('id', 'email') : [];
			const userIds = new Map<string, number>(people.map((u: Row) => [(u.email as string).toLowerCase(), u.id as number]));
			const idMaps = new Map<string, Map<number, number>>(BACKUP_TABLES.map((t) => [t.name, new Map()]));
			const gelIds = idMaps.get('library_custom_gels')!;
			const pendingTargets: { table: string; id: number; column: string; value: unknown }[] = [];

			for (const t of BACKUP_TABLES) {
				const columns = (await columnsOf(trx, t.name)).filter((c) => c.name !== 'id' && c.name !== 'project_id');
				const map = idMaps.get(t.name)!;
				const rows = [...(backup.tables[t.name] ?? [])].sort((a, b) => (a.id as number) - (b.id as number));
				for (const r of rows) {
					const out: Row = { project_id: project.id };
					for (const c of columns) {
						if (!(c.name in r) || t.omit?.includes(c.name)) continue;
						let v = r[c.name];
						if (v !== null && v !== undefined) {
							if (t.users.includes(c.name)) v = typeof v === 'string' ? (userIds.get(v.toLowerCase()) ?? null) : null;
							// A reference to a row that is not in the backup becomes null (refused below where required).
							else if (c.name in t.refs) v = idMaps.get(t.refs[c.name])!.get(v as number) ?? null;
							else if (t.json.includes(c.name)) {
								if (t.gelRefs?.includes(c.name)) v = remapGelIds(v, gelIds);
								if (t.name === 'activity' && c.name === 'details') v = remapDetails(v, idMaps);
								v = JSON.stringify(v);
							} else if (c.type.includes('blob')) v = Buffer.from(String((v as { base64?: string }).base64 ?? ''), 'base64');
							else if (c.type === 'datetime' || c.type === 'timestamp') v = new Date(v as string);
						}
						out[c.name] = v;
					}
					if (t.scoped) out.scope_id = project.id;
					if (t.subject && typeof r.subject_type === 'string' && r.subject_id != null) {
						const target = t.subject[r.subject_type];
						out.subject_id = target ? (idMaps.get(target)!.get(r.subject_id as number) ?? null) : r.subject_type === 'project' ? project.id : null;
						if (out.subject_id === null && t.name === 'comments') continue; // a comment on something not in the backup
					}
					const readingTarget = (t.name === 'setups' || t.name === 'accepted_fixes') && (r.target as { kind?: string } | null)?.kind === 'reading';
					if (readingTarget) out.target = null;
					const photo = t.name === 'photos' ? await photoToRestore(r, out) : null;
					if (t.name === 'photos' && !photo) continue;
					let newId: number;
					try {
						[newId] = await trx(t.name).insert(out);
					} catch (e) {
						throw new LogError('invalid', `The backup’s ${t.name} row ${r.id} could not be restored: ${(e as Error).message.split('\n')[0]}`);
					}
					newId = Number(newId);
					map.set(r.id as number, newId);
					if (readingTarget) pendingTargets.push({ table: t.name, id: newId, column: 'target', value: r.target });
					if (photo) await storePhoto(trx, project.id, newId, photo, written);
				}
			}
			// Targets that name a reading, now that readings have their new ids.
			const readingIds = idMaps.get('readings')!;
			for (const p of pendingTargets) {
				await trx(p.table).where({ id: p.id }).update({ [p.column]: JSON.stringify(remapTarget(p.value, readingIds)) });
			}

			const added: RestoreResult['added'] = [];
			const invited: RestoreResult['invited'] = [];
			for (const m of keepMembers ? crewToBring(backup, user) : []) {
				const account = await users.readByEmail(m.email, trx);
				if (account && (await members.shareAProject(user.id, account.id, trx))) {
					await members.create(project.id, account.id, m.role, trx);
					added.push(m);
				} else {
					const { token } = await invitations.create({ projectId: project.id, email: m.email, role: m.role, invitedBy: user.id, ttlSeconds: LIFETIMES.invitation }, trx);
					mails.push({ ...m, token });
					invited.push(m);
				}
			}

			const crew = keepMembers ? `; ${added.length} of the crew added, ${invited.length} invited by e-mail` : '';
			await trx('activity').insert({
				project_id: project.id,
				user_id: user.id,
				action: 'project.restore',
				subject_type: 'project',
				subject_id: project.id,
				summary: `Restored from a backup of “${backup.project.name}”${backup.exportedAt ? ` made ${backup.exportedAt.slice(0, 16).replace('T', ' ')} UTC` : ''}${crew}`,
				details: JSON.stringify({ added: added.map((a) => a.email), invited: invited.map((i) => i.email) })
			});
			return { projectId: project.id, added, invited };
		});
	} catch (e) {
		// The rows are gone with the transaction; so must be the photos already written.
		await storage.remove(written).catch((err) => console.warn('[backup] photos of a failed restore were not removed:', err));
		throw e;
	}

	const mailFailed: string[] = [];
	const projectName = name?.trim() || backup.project.name;
	for (const m of mails) {
		try {
			await sendInvitation(m.email, {
				inviterName: user.name || user.email,
				projectName,
				roleLabel: ROLE_LABELS[m.role],
				url: `${origin.replace(/\/$/, '')}/invite/${m.token}`,
				lifetimeSeconds: LIFETIMES.invitation
			});
		} catch (e) {
			mailFailed.push(m.email);
			console.error('[backup] invitation mail failed:', (e as Error).message);
		}
	}
	return { ...result, mailFailed };
}

type CheckedPhoto = Awaited<ReturnType<typeof restoredPhoto>>;

/**
 * Prepares a photo row for insert: a ready photo needs its objects in the file (checked again, the
 * stored figures taken from the bytes); a refused one keeps its reason and has no objects. Null for
 * a row that cannot come back (ready without its file, or still pending).
 */
async function photoToRestore(r: Row, out: Row): Promise<CheckedPhoto | 'no-objects' | null> {
	out.incoming_key = 'pending';
	out.original_key = null;
	out.thumbnail_key = null;
	if (r.status === 'rejected') return 'no-objects';
	if (r.status !== 'ready') return null;
	const objects = r.objects as { original?: unknown; thumbnail?: unknown } | null;
	const original = bytesOf(objects?.original);
	if (!original) return null;
	try {
		storage.bucket();
	} catch (e) {
		if (e instanceof StorageConfigError) throw new LogError('invalid', 'This backup holds photos, and photo storage is not set up on this server.');
		throw e;
	}
	let checked: CheckedPhoto;
	try {
		checked = await restoredPhoto(original, bytesOf(objects?.thumbnail));
	} catch (e) {
		if (e instanceof PhotoRejection) throw new LogError('invalid', `The backup’s photo ${r.id} could not be restored: ${e.message}`);
		throw e;
	}
	Object.assign(out, {
		content_type: checked.original.contentType,
		bytes: checked.original.bytes.byteLength,
		width: checked.original.width,
		height: checked.original.height,
		thumbnail_width: checked.thumbnail.width,
		thumbnail_height: checked.thumbnail.height
	});
	return checked;
}

/** Writes a restored photo's objects under the new project and points its row at them. */
async function storePhoto(trx: Knex.Transaction, projectId: number, photoId: number, photo: CheckedPhoto | 'no-objects', written: string[]): Promise<void> {
	const patch: Row = { incoming_key: incomingKey(projectId, photoId) };
	if (photo !== 'no-objects') {
		const keys = finalKeys(projectId, photoId, photo.original.extension);
		written.push(keys.original, keys.thumbnail);
		await storage.write(keys.original, photo.original.bytes, { contentType: photo.original.contentType });
		await storage.write(keys.thumbnail, photo.thumbnail.bytes, { contentType: photo.thumbnail.contentType });
		Object.assign(patch, { original_key: keys.original, thumbnail_key: keys.thumbnail });
	}
	await trx('photos').where({ id: photoId }).update(patch);
}
