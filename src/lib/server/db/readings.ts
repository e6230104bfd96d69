/**
 * Readings: one measured or typed record of one light at one moment. The input is kept exactly as
 * read (`raw`), next to the values computed from it and the computation version that made them.
 */
import type { Knex } from 'knex';
import type { ReadingAnalysis } from '../../colour';
import { db } from './index';
import { parseJson, toDateTime, toJson } from './json';

export type ReadingKind = 'spectral' | 'chromaticity_xy' | 'chromaticity_uv_prime' | 'cct_duv' | 'tristimulus';

/** A spectrum as stored: plain numbers, so it survives JSON. */
export interface StoredSpectrum {
	start: number;
	interval: number;
	values: number[];
	scale: 'relative' | 'absolute';
}

export type RawReading =
	| { kind: 'spectral'; spectrum: StoredSpectrum; lux?: number | null }
	| { kind: 'chromaticity_xy'; x: number; y: number; lux?: number | null }
	| { kind: 'chromaticity_uv_prime'; u_prime: number; v_prime: number; lux?: number | null }
	| { kind: 'cct_duv'; cct_k: number; duv: number; lux?: number | null }
	| { kind: 'tristimulus'; X: number; Y: number; Z: number; lux?: number | null };

/** The values computed from `raw`: exactly the colour core's analysis of it. */
export type Computed = ReadingAnalysis;

export interface Reading {
	id: number;
	projectId: number;
	setupId: number | null;
	lightId: number | null;
	uploadId: number | null;
	sourceRow: number | null;
	label: string;
	kind: ReadingKind;
	takenAt: string | null;
	meter: string | null;
	notes: string | null;
	raw: RawReading;
	computed: Computed;
	computationVersion: string;
	version: number;
	createdBy: number | null;
	updatedBy: number | null;
	createdAt: string;
	updatedAt: string;
	deletedAt: string | null;
}

export interface NewReading {
	projectId: number;
	setupId?: number | null;
	lightId?: number | null;
	uploadId?: number | null;
	sourceRow?: number | null;
	label: string;
	takenAt?: string | Date | null;
	meter?: string | null;
	notes?: string | null;
	raw: RawReading;
	computed: Computed;
	computationVersion: string;
	createdBy: number | null;
}

type Row = Record<string, unknown>;

const iso = (v: unknown): string | null => (v instanceof Date ? v.toISOString() : v ? String(v) : null);

function fromRow(r: Row): Reading {
	const computed = parseJson<Computed>(r.analysis) as Computed;
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		setupId: (r.setup_id as number | null) ?? null,
		lightId: (r.light_id as number | null) ?? null,
		uploadId: (r.upload_id as number | null) ?? null,
		sourceRow: (r.source_row as number | null) ?? null,
		label: r.label as string,
		kind: r.kind as ReadingKind,
		takenAt: iso(r.taken_at),
		meter: (r.meter as string | null) ?? null,
		notes: (r.notes as string | null) ?? null,
		raw: parseJson<RawReading>(r.raw) as RawReading,
		computed,
		computationVersion: r.computation_version as string,
		version: r.version as number,
		createdBy: (r.created_by as number | null) ?? null,
		updatedBy: (r.updated_by as number | null) ?? null,
		createdAt: iso(r.created_at) as string,
		updatedAt: iso(r.updated_at) as string,
		deletedAt: iso(r.deleted_at)
	};
}

function computedColumns(c: Computed, version: string): Row {
	return {
		x: c.x,
		y: c.y,
		u_prime: c.u_prime,
		v_prime: c.v_prime,
		cct_k: c.cct_k,
		duv: c.duv,
		lux: c.lux,
		cri_ra: c.cri?.ra ?? null,
		cri_r9: c.cri?.r[8] ?? null,
		ssi: c.ssi,
		analysis: toJson(c),
		computation_version: version
	};
}

function toRow(n: NewReading): Row {
	return {
		project_id: n.projectId,
		setup_id: n.setupId ?? null,
		light_id: n.lightId ?? null,
		upload_id: n.uploadId ?? null,
		source_row: n.sourceRow ?? null,
		label: n.label.slice(0, 200),
		kind: n.raw.kind,
		taken_at: toDateTime(n.takenAt ?? null),
		meter: n.meter ?? null,
		notes: n.notes ?? null,
		raw: toJson(n.raw),
		...computedColumns(n.computed, n.computationVersion),
		created_by: n.createdBy,
		updated_by: n.createdBy
	};
}

export async function create(n: NewReading, trx: Knex | Knex.Transaction = db): Promise<Reading> {
	const [id] = await trx('readings').insert(toRow(n));
	return (await read(n.projectId, Number(id), { includeDeleted: true }, trx)) as Reading;
}

/**
 * Inserts many in multi-row batches inside the caller's transaction; returns how many. Ids are not
 * returned: they need not be consecutive (Galera steps auto-increment by the cluster size), so
 * callers find the rows again by `upload_id`.
 */
export async function createMany(rows: NewReading[], trx: Knex.Transaction): Promise<number> {
	for (let i = 0; i < rows.length; i += 1000) {
		await trx('readings').insert(rows.slice(i, i + 1000).map(toRow));
	}
	return rows.length;
}

export async function read(
	projectId: number,
	id: number,
	{ includeDeleted = false }: { includeDeleted?: boolean } = {},
	trx: Knex | Knex.Transaction = db
): Promise<Reading | null> {
	const q = trx('readings').where({ project_id: projectId, id });
	if (!includeDeleted) q.whereNull('deleted_at');
	const row = await q.first();
	return row ? fromRow(row) : null;
}

export const SORTABLE = ['taken_at', 'created_at', 'label', 'cct_k', 'duv', 'cri_ra', 'id'] as const;
export type SortKey = (typeof SORTABLE)[number];

export interface ListOptions {
	setupId?: number;
	lightId?: number;
	from?: string;
	to?: string;
	kind?: ReadingKind;
	sort?: SortKey;
	order?: 'asc' | 'desc';
	limit?: number;
	offset?: number;
}

export async function list(projectId: number, o: ListOptions = {}): Promise<{ items: Reading[]; total: number }> {
	const q = db('readings').where({ project_id: projectId }).whereNull('deleted_at');
	if (o.setupId !== undefined) q.where('setup_id', o.setupId);
	if (o.lightId !== undefined) q.where('light_id', o.lightId);
	if (o.kind !== undefined) q.where('kind', o.kind);
	if (o.from) q.where(db.raw('COALESCE(taken_at, created_at)'), '>=', toDateTime(o.from));
	if (o.to) q.where(db.raw('COALESCE(taken_at, created_at)'), '<=', toDateTime(o.to));
	const [{ n }] = (await q.clone().count({ n: '*' })) as { n: number }[];
	const sort = o.sort ?? 'created_at';
	const order = o.order ?? 'desc';
	const rows = await q
		.orderBy(sort, order)
		.orderBy('id', order)
		.limit(o.limit ?? 50)
		.offset(o.offset ?? 0);
	return { items: rows.map(fromRow), total: Number(n) };
}

export interface ReadingPatch {
	label?: string;
	setupId?: number | null;
	lightId?: number | null;
	notes?: string | null;
	takenAt?: string | null;
}

/**
 * Applies a patch when `expectedVersion` is still current. Returns the updated reading, or
 * `{ conflict }` with the current row when someone else saved first.
 */
export async function update(
	projectId: number,
	id: number,
	patch: ReadingPatch,
	expectedVersion: number,
	userId: number | null
): Promise<{ reading: Reading } | { conflict: Reading } | null> {
	const row: Row = { updated_by: userId, updated_at: db.fn.now(3), version: db.raw('version + 1') };
	if (patch.label !== undefined) row.label = patch.label.slice(0, 200);
	if (patch.setupId !== undefined) row.setup_id = patch.setupId;
	if (patch.lightId !== undefined) row.light_id = patch.lightId;
	if (patch.notes !== undefined) row.notes = patch.notes;
	if (patch.takenAt !== undefined) row.taken_at = toDateTime(patch.takenAt);
	const n = await db('readings')
		.where({ project_id: projectId, id, version: expectedVersion })
		.whereNull('deleted_at')
		.update(row);
	const current = await read(projectId, id);
	if (!current) return null;
	return n === 1 ? { reading: current } : { conflict: current };
}

/** Soft delete: the row stays for the log, hidden from lists. */
export async function destroy(projectId: number, id: number, userId: number | null): Promise<boolean> {
	const n = await db('readings')
		.where({ project_id: projectId, id })
		.whereNull('deleted_at')
		.update({ deleted_at: db.fn.now(3), deleted_by: userId, version: db.raw('version + 1') });
	return n === 1;
}

/** Readings computed by another version of the colour computation (oldest first). */
export async function listStale(currentVersion: string, limit = 500): Promise<Reading[]> {
	const rows = await db('readings').whereNot('computation_version', currentVersion).orderBy('id').limit(limit);
	return rows.map(fromRow);
}

export async function saveComputed(id: number, computed: Computed, version: string): Promise<void> {
	await db('readings').where({ id }).update(computedColumns(computed, version));
}

/** The latest reading of each light in a setup, keyed by light id. */
export async function latestByLight(setupId: number): Promise<Map<number, Reading>> {
	const rows = await db('readings as r')
		.where('r.setup_id', setupId)
		.whereNull('r.deleted_at')
		.whereNotNull('r.light_id')
		.whereNotExists(function () {
			this.select(db.raw('1'))
				.from('readings as r2')
				.whereRaw('r2.light_id = r.light_id')
				.whereNull('r2.deleted_at')
				.whereRaw('(COALESCE(r2.taken_at, r2.created_at) > COALESCE(r.taken_at, r.created_at) OR (COALESCE(r2.taken_at, r2.created_at) = COALESCE(r.taken_at, r.created_at) AND r2.id > r.id))');
		})
		.select('r.*');
	return new Map(rows.map((r: Row) => [r.light_id as number, fromRow(r)]));
}
