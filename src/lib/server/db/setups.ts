/** Setups: one lighting setup on a shoot day, with its target white and status. */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson, toJson } from './json';
import { dateOnly } from './shoot-days';
import type { SetupStatus, StoredTarget } from '../../schemas/log';

export interface SetupFields {
	shootDayId: number;
	name: string;
	notes: string;
	status: SetupStatus;
	target: StoredTarget | null;
	/** Δu'v' within which a light counts as on target. */
	targetTolerance: number;
	targetLockedAt: Date | null;
	targetLockedBy: number | null;
	lockedAt: Date | null;
	lockedBy: number | null;
	position: number;
}

export interface Setup extends SetupFields {
	id: number;
	projectId: number;
	version: number;
	createdBy: number | null;
	updatedBy: number | null;
	createdAt: Date;
	updatedAt: Date;
}

/** A setup with the day it belongs to, for lists. */
export interface SetupSummary extends Setup {
	dayDate: string;
	dayLabel: string;
	lightCount: number;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): Setup {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		shootDayId: r.shoot_day_id as number,
		name: r.name as string,
		notes: (r.notes as string | null) ?? '',
		status: r.status as SetupStatus,
		target: parseJson<StoredTarget>(r.target),
		targetTolerance: Number(r.target_tolerance),
		targetLockedAt: (r.target_locked_at as Date | null) ?? null,
		targetLockedBy: (r.target_locked_by as number | null) ?? null,
		lockedAt: (r.locked_at as Date | null) ?? null,
		lockedBy: (r.locked_by as number | null) ?? null,
		position: r.position as number,
		version: r.version as number,
		createdBy: (r.created_by as number | null) ?? null,
		updatedBy: (r.updated_by as number | null) ?? null,
		createdAt: r.created_at as Date,
		updatedAt: r.updated_at as Date
	};
}

function toColumns(f: Partial<SetupFields>): Row {
	const row: Row = {};
	if (f.shootDayId !== undefined) row.shoot_day_id = f.shootDayId;
	if (f.name !== undefined) row.name = f.name;
	if (f.notes !== undefined) row.notes = f.notes || null;
	if (f.status !== undefined) row.status = f.status;
	if (f.target !== undefined) row.target = toJson(f.target);
	if (f.targetTolerance !== undefined) row.target_tolerance = f.targetTolerance;
	if (f.targetLockedAt !== undefined) row.target_locked_at = f.targetLockedAt;
	if (f.targetLockedBy !== undefined) row.target_locked_by = f.targetLockedBy;
	if (f.lockedAt !== undefined) row.locked_at = f.lockedAt;
	if (f.lockedBy !== undefined) row.locked_by = f.lockedBy;
	if (f.position !== undefined) row.position = f.position;
	return row;
}

/** Whether a setup with this id belongs to the project. */
export async function exists(projectId: number, id: number): Promise<boolean> {
	return Boolean(await db('setups').where({ project_id: projectId, id }).first('id'));
}

export interface ListOptions {
	shootDayId?: number;
	ids?: readonly number[];
}

/** Setups in shooting order: by day, then position, then id. */
export async function list(projectId: number, o: ListOptions = {}, q: Knex = db): Promise<SetupSummary[]> {
	const query = q('setups as s')
		.join('shoot_days as d', 'd.id', 's.shoot_day_id')
		.where('s.project_id', projectId)
		.select('s.*', 'd.shoot_date as day_date', 'd.label as day_label')
		.select(q.raw('(SELECT COUNT(*) FROM lights l WHERE l.setup_id = s.id AND l.deleted_at IS NULL) AS light_count'))
		.orderBy('d.shoot_date')
		.orderBy('d.id')
		.orderBy('s.position')
		.orderBy('s.id');
	if (o.shootDayId !== undefined) query.where('s.shoot_day_id', o.shootDayId);
	if (o.ids) query.whereIn('s.id', o.ids.length ? [...o.ids] : [0]);
	const rows = await query;
	return rows.map((r: Row) => ({ ...fromRow(r), dayDate: dateOnly(r.day_date), dayLabel: (r.day_label as string) ?? '', lightCount: Number(r.light_count) }));
}

export async function read(projectId: number, id: number, q: Knex = db): Promise<Setup | null> {
	const row = await q('setups').where({ project_id: projectId, id }).first();
	return row ? fromRow(row) : null;
}

export type NewSetup = Pick<SetupFields, 'shootDayId' | 'name'> & Partial<SetupFields>;

export async function create(projectId: number, fields: NewSetup, userId: number | null, q: Knex = db): Promise<Setup> {
	const position =
		fields.position ??
		Number((await q('setups').where({ shoot_day_id: fields.shootDayId }).max({ p: 'position' }).first())?.p ?? -1) + 1;
	const [id] = await q('setups').insert({ project_id: projectId, ...toColumns({ ...fields, position }), created_by: userId, updated_by: userId });
	return (await read(projectId, Number(id), q)) as Setup;
}

/**
 * Applies the changes when `expectedVersion` is still current. Returns `{ setup }`, `{ conflict }`
 * with the row as it now is when someone saved first, or null when the setup is gone.
 */
export async function update(
	projectId: number,
	id: number,
	changes: Partial<SetupFields>,
	expectedVersion: number,
	userId: number | null,
	q: Knex = db
): Promise<{ setup: Setup } | { conflict: Setup } | null> {
	const n = await q('setups')
		.where({ project_id: projectId, id, version: expectedVersion })
		.update({ ...toColumns(changes), updated_by: userId, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	const current = await read(projectId, id, q);
	if (!current) return null;
	return n === 1 ? { setup: current } : { conflict: current };
}

/** Deletes the setup with its lights and circuits (readings stay, unassigned). */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('setups').where({ project_id: projectId, id }).delete()) === 1;
}

/** Locked setups among those of one day (to refuse deleting the day). */
export async function lockedOnDay(projectId: number, shootDayId: number, q: Knex = db): Promise<number> {
	const [{ n }] = (await q('setups').where({ project_id: projectId, shoot_day_id: shootDayId }).whereNotNull('locked_at').count({ n: '*' })) as { n: number }[];
	return Number(n);
}
