/** Uploaded files, kept byte for byte (LONGBLOB) with their SHA-256, so readings can be re-derived. */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson, toJson } from './json';

export type UploadStatus = 'previewed' | 'imported' | 'discarded';

export interface Upload {
	id: number;
	projectId: number;
	filename: string;
	contentType: string;
	sizeBytes: number;
	sha256: string;
	status: UploadStatus;
	mapping: unknown;
	report: unknown;
	uploadedBy: number | null;
	createdAt: string;
	importedAt: string | null;
}

type Row = Record<string, unknown>;
const COLUMNS = ['id', 'project_id', 'filename', 'content_type', 'size_bytes', 'sha256', 'status', 'mapping', 'report', 'uploaded_by', 'created_at', 'imported_at'];
const iso = (v: unknown): string | null => (v instanceof Date ? v.toISOString() : v ? String(v) : null);

function fromRow(r: Row): Upload {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		filename: r.filename as string,
		contentType: r.content_type as string,
		sizeBytes: r.size_bytes as number,
		sha256: r.sha256 as string,
		status: r.status as UploadStatus,
		mapping: parseJson(r.mapping),
		report: parseJson(r.report),
		uploadedBy: (r.uploaded_by as number | null) ?? null,
		createdAt: iso(r.created_at) as string,
		importedAt: iso(r.imported_at)
	};
}

export function sha256(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

export async function create(
	u: { projectId: number; filename: string; contentType: string; bytes: Uint8Array; uploadedBy: number | null; report?: unknown; mapping?: unknown },
	trx: Knex | Knex.Transaction = db
): Promise<Upload> {
	const [id] = await trx('uploads').insert({
		project_id: u.projectId,
		filename: u.filename.slice(0, 255),
		content_type: u.contentType.slice(0, 120) || 'application/octet-stream',
		size_bytes: u.bytes.byteLength,
		sha256: sha256(u.bytes),
		content: Buffer.from(u.bytes.buffer, u.bytes.byteOffset, u.bytes.byteLength),
		uploaded_by: u.uploadedBy,
		report: toJson(u.report ?? null),
		mapping: toJson(u.mapping ?? null)
	});
	return (await read(u.projectId, Number(id), trx)) as Upload;
}

export async function read(projectId: number, id: number, trx: Knex | Knex.Transaction = db): Promise<Upload | null> {
	const row = await trx('uploads').select(COLUMNS).where({ project_id: projectId, id }).first();
	return row ? fromRow(row) : null;
}

/** The original bytes. */
export async function content(projectId: number, id: number): Promise<Buffer | null> {
	const row = await db('uploads').select('content').where({ project_id: projectId, id }).first();
	return row ? (row.content as Buffer) : null;
}

/** Earlier uploads of the same bytes to the same project (newest first). */
export async function findSame(projectId: number, hash: string): Promise<Upload[]> {
	const rows = await db('uploads').select(COLUMNS).where({ project_id: projectId, sha256: hash }).orderBy('id', 'desc');
	return rows.map(fromRow);
}

export async function list(projectId: number, limit = 50): Promise<Upload[]> {
	const rows = await db('uploads').select(COLUMNS).where({ project_id: projectId }).orderBy('id', 'desc').limit(limit);
	return rows.map(fromRow);
}

export async function markImported(id: number, mapping: unknown, report: unknown, trx: Knex.Transaction): Promise<void> {
	await trx('uploads').where({ id }).update({ status: 'imported', imported_at: trx.fn.now(3), mapping: toJson(mapping), report: toJson(report) });
}
