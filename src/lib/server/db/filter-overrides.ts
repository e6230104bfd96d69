/** A project's changes to the built-in filters' nominal mired shift and light loss, one row per filter. */
import type { Knex } from 'knex';
import { db } from './index';

export interface FilterOverride {
	id: number;
	projectId: number;
	/** Built-in filter id, e.g. `ctb-half`. */
	gelId: string;
	miredShift: number | null;
	lossStops: number | null;
	note: string;
	version: number;
	updatedBy: number | null;
	updatedByName: string | null;
	updatedAt: Date;
}

type Row = Record<string, unknown>;
const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

function fromRow(r: Row): FilterOverride {
	return {
		id: Number(r.id),
		projectId: Number(r.project_id),
		gelId: String(r.gel_id),
		miredShift: num(r.mired_shift),
		lossStops: num(r.loss_stops),
		note: String(r.note ?? ''),
		version: Number(r.version),
		updatedBy: num(r.updated_by),
		updatedByName: (r.updated_by_name as string | null) ?? null,
		updatedAt: r.updated_at as Date
	};
}

function select(q: Knex) {
	return q('library_filter_overrides as o')
		.leftJoin('users as u', 'u.id', 'o.updated_by')
		.select('o.*', q.raw("COALESCE(NULLIF(u.name, ''), u.email) AS updated_by_name"));
}

export async function list(projectId: number, q: Knex = db): Promise<FilterOverride[]> {
	const rows = await select(q).where('o.project_id', projectId).orderBy('o.gel_id');
	return rows.map(fromRow);
}

export async function read(projectId: number, gelId: string, q: Knex = db): Promise<FilterOverride | null> {
	const row = await select(q).where({ 'o.project_id': projectId, 'o.gel_id': gelId }).first();
	return row ? fromRow(row) : null;
}

export interface OverrideFields {
	miredShift: number | null;
	lossStops: number | null;
	note: string;
}

/** Creates or replaces the project's override of one filter. */
export async function upsert(projectId: number, gelId: string, f: OverrideFields, userId: number | null, q: Knex = db): Promise<FilterOverride> {
	await q('library_filter_overrides')
		.insert({ project_id: projectId, gel_id: gelId, mired_shift: f.miredShift, loss_stops: f.lossStops, note: f.note, created_by: userId, updated_by: userId })
		.onConflict(['project_id', 'gel_id'])
		.merge({ mired_shift: f.miredShift, loss_stops: f.lossStops, note: f.note, updated_by: userId, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	return (await read(projectId, gelId, q)) as FilterOverride;
}

/** Removes the override; true when there was one. */
export async function destroy(projectId: number, gelId: string, q: Knex = db): Promise<boolean> {
	return (await q('library_filter_overrides').where({ project_id: projectId, gel_id: gelId }).delete()) > 0;
}
