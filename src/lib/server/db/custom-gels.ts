/**
 * Custom filters made from a measured transmission: shared (projectId null) or one project's.
 * The transmission is stored as fractions 0..1 on the grid it was measured on; the uploaded file is
 * kept as received.
 */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson } from './json';

/** A shared row (null) or one project's (its id). */
export type Scope = number | null;
const scopeId = (s: Scope) => s ?? 0;

export interface StoredSpectrum {
	start: number;
	interval: number;
	values: number[];
}

export interface CustomGelRow {
	id: number;
	projectId: number | null;
	name: string;
	notes: string;
	transmission: StoredSpectrum;
	sourceUnit: 'percent' | 'fraction';
	originalName: string;
	sha256: string;
	createdBy: number | null;
	createdByName: string | null;
	createdAt: Date;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): CustomGelRow {
	return {
		id: Number(r.id),
		projectId: r.project_id === null || r.project_id === undefined ? null : Number(r.project_id),
		name: String(r.name),
		notes: String(r.notes ?? ''),
		transmission: parseJson<StoredSpectrum>(r.transmission) as StoredSpectrum,
		sourceUnit: r.source_unit as 'percent' | 'fraction',
		originalName: String(r.original_name ?? ''),
		sha256: String(r.sha256),
		createdBy: r.created_by === null || r.created_by === undefined ? null : Number(r.created_by),
		createdByName: (r.created_by_name as string | null) ?? null,
		createdAt: r.created_at as Date
	};
}

function select(q: Knex) {
	return q('library_custom_gels as g')
		.leftJoin('users as u', 'u.id', 'g.created_by')
		.select(
			'g.id',
			'g.project_id',
			'g.name',
			'g.notes',
			'g.transmission',
			'g.source_unit',
			'g.original_name',
			'g.sha256',
			'g.created_by',
			'g.created_at',
			q.raw("COALESCE(NULLIF(u.name, ''), u.email) AS created_by_name")
		);
}

/** The scope's filters, oldest first. */
export async function list(scope: Scope, q: Knex = db): Promise<CustomGelRow[]> {
	const rows = await select(q).where('g.scope_id', scopeId(scope)).orderBy('g.id');
	return rows.map(fromRow);
}

export async function count(scope: Scope, q: Knex = db): Promise<number> {
	const r = await q('library_custom_gels').where('scope_id', scopeId(scope)).count({ n: '*' }).first();
	return Number(r?.n ?? 0);
}

export async function read(scope: Scope, id: number, q: Knex = db): Promise<CustomGelRow | null> {
	const row = await select(q).where({ 'g.scope_id': scopeId(scope), 'g.id': id }).first();
	return row ? fromRow(row) : null;
}

export async function nameTaken(scope: Scope, name: string, q: Knex = db): Promise<boolean> {
	return (await q('library_custom_gels').where({ scope_id: scopeId(scope), name }).first('id')) !== undefined;
}

export interface NewCustomGel {
	name: string;
	notes: string;
	transmission: StoredSpectrum;
	sourceUnit: 'percent' | 'fraction';
	originalName: string;
	sha256: string;
	sourceCsv: Uint8Array;
}

export async function create(scope: Scope, g: NewCustomGel, userId: number | null, q: Knex = db): Promise<CustomGelRow> {
	const [id] = await q('library_custom_gels').insert({
		project_id: scope,
		scope_id: scopeId(scope),
		name: g.name,
		notes: g.notes || null,
		transmission: JSON.stringify(g.transmission),
		source_unit: g.sourceUnit,
		original_name: g.originalName.slice(0, 255),
		sha256: g.sha256,
		source_csv: Buffer.from(g.sourceCsv),
		created_by: userId,
		updated_by: userId
	});
	return (await read(scope, Number(id), q)) as CustomGelRow;
}

/** The file as uploaded. */
export async function sourceFile(scope: Scope, id: number, q: Knex = db): Promise<{ name: string; bytes: Buffer } | null> {
	const row = await q('library_custom_gels').where({ scope_id: scopeId(scope), id }).first('original_name', 'source_csv');
	return row ? { name: String(row.original_name), bytes: row.source_csv as Buffer } : null;
}

export async function destroy(scope: Scope, id: number, q: Knex = db): Promise<boolean> {
	return (await q('library_custom_gels').where({ scope_id: scopeId(scope), id }).delete()) > 0;
}
