/** Photos of the set: one row per photo, its object keys, status and what the server found in it. */
import type { Knex } from 'knex';
import { db } from './index';

export type PhotoStatus = 'pending' | 'ready' | 'rejected';
export const PHOTO_STATUSES: readonly PhotoStatus[] = ['pending', 'ready', 'rejected'];

export interface Photo {
	id: number;
	projectId: number;
	setupId: number | null;
	lightId: number | null;
	caption: string;
	originalName: string;
	declaredType: string;
	declaredBytes: number;
	incomingKey: string;
	originalKey: string | null;
	thumbnailKey: string | null;
	contentType: string | null;
	bytes: number | null;
	width: number | null;
	height: number | null;
	thumbnailWidth: number | null;
	thumbnailHeight: number | null;
	status: PhotoStatus;
	rejectCode: string | null;
	rejectReason: string | null;
	hadLocation: boolean | null;
	uploadedBy: number | null;
	uploadedByName: string | null;
	createdAt: string;
	updatedAt: string;
	completedAt: string | null;
}

type Row = Record<string, unknown>;
const iso = (v: unknown): string | null => (v instanceof Date ? v.toISOString() : v ? String(v) : null);
const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

function fromRow(r: Row): Photo {
	return {
		id: Number(r.id),
		projectId: Number(r.project_id),
		setupId: num(r.setup_id),
		lightId: num(r.light_id),
		caption: String(r.caption ?? ''),
		originalName: String(r.original_name ?? ''),
		declaredType: String(r.declared_type),
		declaredBytes: Number(r.declared_bytes),
		incomingKey: String(r.incoming_key),
		originalKey: (r.original_key as string | null) ?? null,
		thumbnailKey: (r.thumbnail_key as string | null) ?? null,
		contentType: (r.content_type as string | null) ?? null,
		bytes: num(r.bytes),
		width: num(r.width),
		height: num(r.height),
		thumbnailWidth: num(r.thumbnail_width),
		thumbnailHeight: num(r.thumbnail_height),
		status: r.status as PhotoStatus,
		rejectCode: (r.reject_code as string | null) ?? null,
		rejectReason: (r.reject_reason as string | null) ?? null,
		hadLocation: r.had_location === null || r.had_location === undefined ? null : Boolean(r.had_location),
		uploadedBy: num(r.uploaded_by),
		uploadedByName: (r.uploaded_by_name as string | null) ?? null,
		createdAt: iso(r.created_at) as string,
		updatedAt: iso(r.updated_at) as string,
		completedAt: iso(r.completed_at)
	};
}

function selectPhotos(trx: Knex | Knex.Transaction) {
	return trx('photos as p')
		.leftJoin('users as u', 'u.id', 'p.uploaded_by')
		.select('p.*', trx.raw("COALESCE(NULLIF(u.name, ''), u.email) AS uploaded_by_name"));
}

export interface NewPhoto {
	projectId: number;
	setupId: number | null;
	lightId: number | null;
	caption: string;
	originalName: string;
	declaredType: string;
	declaredBytes: number;
	uploadedBy: number;
}

/** Inserts a pending photo; `incomingKey(id)` names where the browser will put the file. */
export async function create(p: NewPhoto, incomingKey: (id: number) => string): Promise<Photo> {
	return db.transaction(async (trx) => {
		const [id] = await trx('photos').insert({
			project_id: p.projectId,
			setup_id: p.setupId,
			light_id: p.lightId,
			caption: p.caption.slice(0, 500),
			original_name: p.originalName.slice(0, 255),
			declared_type: p.declaredType.slice(0, 100),
			declared_bytes: p.declaredBytes,
			incoming_key: 'pending',
			uploaded_by: p.uploadedBy
		});
		await trx('photos').where({ id }).update({ incoming_key: incomingKey(Number(id)) });
		return (await read(p.projectId, Number(id), trx)) as Photo;
	});
}

export async function read(projectId: number, id: number, trx: Knex | Knex.Transaction = db): Promise<Photo | null> {
	const row = await selectPhotos(trx).where({ 'p.project_id': projectId, 'p.id': id }).first();
	return row ? fromRow(row) : null;
}

export interface PhotoFilter {
	setupId?: number;
	lightId?: number;
	status?: PhotoStatus | 'any';
	limit?: number;
	offset?: number;
}

/** Newest first. A setup filter includes the photos of that setup's lights. */
export async function list(projectId: number, f: PhotoFilter = {}): Promise<{ items: Photo[]; total: number }> {
	const where = (q: Knex.QueryBuilder) => {
		q.where('p.project_id', projectId);
		if (f.setupId !== undefined) q.where('p.setup_id', f.setupId);
		if (f.lightId !== undefined) q.where('p.light_id', f.lightId);
		if (f.status !== 'any') q.where('p.status', f.status ?? 'ready');
		return q;
	};
	const rows = await where(selectPhotos(db))
		.orderBy('p.created_at', 'desc')
		.orderBy('p.id', 'desc')
		.limit(f.limit ?? 100)
		.offset(f.offset ?? 0);
	const [{ n }] = await where(db('photos as p').count({ n: '*' }));
	return { items: rows.map(fromRow), total: Number(n) };
}

export interface ReadyDetails {
	originalKey: string;
	thumbnailKey: string;
	contentType: string;
	bytes: number;
	width: number;
	height: number;
	thumbnailWidth: number;
	thumbnailHeight: number;
	hadLocation: boolean;
}

/** Marks a pending photo ready. False when it was no longer pending (someone else finished it). */
export async function markReady(projectId: number, id: number, d: ReadyDetails): Promise<boolean> {
	const n = await db('photos')
		.where({ project_id: projectId, id, status: 'pending' })
		.update({
			status: 'ready',
			original_key: d.originalKey,
			thumbnail_key: d.thumbnailKey,
			content_type: d.contentType,
			bytes: d.bytes,
			width: d.width,
			height: d.height,
			thumbnail_width: d.thumbnailWidth,
			thumbnail_height: d.thumbnailHeight,
			had_location: d.hadLocation,
			completed_at: db.fn.now(3),
			updated_at: db.fn.now(3)
		});
	return n > 0;
}

/** Marks a pending photo rejected with a reason for the person who sent it. */
export async function markRejected(projectId: number, id: number, r: { code: string; reason: string; hadLocation?: boolean | null }): Promise<boolean> {
	const n = await db('photos')
		.where({ project_id: projectId, id, status: 'pending' })
		.update({
			status: 'rejected',
			reject_code: r.code.slice(0, 40),
			reject_reason: r.reason.slice(0, 500),
			had_location: r.hadLocation ?? null,
			completed_at: db.fn.now(3),
			updated_at: db.fn.now(3)
		});
	return n > 0;
}

export async function updateCaption(projectId: number, id: number, caption: string): Promise<boolean> {
	const n = await db('photos').where({ project_id: projectId, id }).update({ caption: caption.slice(0, 500), updated_at: db.fn.now(3) });
	return n > 0;
}

export async function destroy(projectId: number, id: number): Promise<boolean> {
	return (await db('photos').where({ project_id: projectId, id }).delete()) > 0;
}

/** Every object key the project's photo rows name (incoming, cleaned original, thumbnail). */
export async function keysOf(projectId: number, trx: Knex | Knex.Transaction = db): Promise<string[]> {
	const rows = await trx('photos').where({ project_id: projectId }).select('incoming_key', 'original_key', 'thumbnail_key');
	return rows.flatMap((r: Row) => [r.incoming_key, r.original_key, r.thumbnail_key]).filter((k): k is string => typeof k === 'string' && k !== '' && k !== 'pending');
}

/** Pending photos whose upload was granted before `before` and never finished. */
export async function stalePending(before: Date, limit = 50): Promise<Photo[]> {
	const rows = await selectPhotos(db).where('p.status', 'pending').where('p.created_at', '<', before).orderBy('p.id').limit(limit);
	return rows.map(fromRow);
}

/** What a photo can be attached to: the project's setups (with their day) and their lights. */
export interface PhotoSubject {
	setupId: number;
	setupName: string;
	dayLabel: string;
	lights: { id: number; label: string }[];
}

export async function subjects(projectId: number): Promise<PhotoSubject[]> {
	const setupRows = await db('setups as s')
		.join('shoot_days as d', 'd.id', 's.shoot_day_id')
		.where('s.project_id', projectId)
		.select('s.id', 's.name', 'd.label', 'd.shoot_date')
		.orderBy('d.shoot_date')
		.orderBy('s.position')
		.orderBy('s.id');
	const lightRows = await db('lights').where({ project_id: projectId }).whereNull('deleted_at').select('id', 'label', 'setup_id').orderBy('position').orderBy('id');
	return setupRows.map((s: Row) => {
		const date = s.shoot_date instanceof Date ? s.shoot_date.toISOString().slice(0, 10) : String(s.shoot_date ?? '').slice(0, 10);
		return {
			setupId: Number(s.id),
			setupName: String(s.name),
			dayLabel: String(s.label || date),
			lights: lightRows.filter((l: Row) => Number(l.setup_id) === Number(s.id)).map((l: Row) => ({ id: Number(l.id), label: String(l.label) }))
		};
	});
}
