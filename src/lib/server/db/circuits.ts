/** Circuits: the breakers or sockets a setup's lights are plugged into, for its power plan. */
import type { Knex } from 'knex';
import { db } from './index';

export interface Circuit {
	id: number;
	projectId: number;
	setupId: number;
	label: string;
	/** The supply preset it started from (`na-20`, `uk-13`…), or null. */
	preset: string | null;
	volts: number;
	amps: number;
	/** Share of the breaker rating allowed for continuous load (0.8 common practice). */
	derating: number;
	version: number;
	createdBy: number | null;
	updatedBy: number | null;
	createdAt: Date;
	updatedAt: Date;
}

export interface CircuitFields {
	label: string;
	preset: string | null;
	volts: number;
	amps: number;
	derating: number;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): Circuit {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		setupId: r.setup_id as number,
		label: r.label as string,
		preset: (r.preset as string | null) ?? null,
		volts: Number(r.volts),
		amps: Number(r.amps),
		derating: Number(r.derating),
		version: r.version as number,
		createdBy: (r.created_by as number | null) ?? null,
		updatedBy: (r.updated_by as number | null) ?? null,
		createdAt: r.created_at as Date,
		updatedAt: r.updated_at as Date
	};
}

function toColumns(f: Partial<CircuitFields>): Row {
	const row: Row = {};
	if (f.label !== undefined) row.label = f.label;
	if (f.preset !== undefined) row.preset = f.preset;
	if (f.volts !== undefined) row.volts = f.volts;
	if (f.amps !== undefined) row.amps = f.amps;
	if (f.derating !== undefined) row.derating = f.derating;
	return row;
}

export async function list(projectId: number, o: { setupId?: number; setupIds?: readonly number[] } = {}, q: Knex = db): Promise<Circuit[]> {
	const query = q('circuits').where({ project_id: projectId }).orderBy('setup_id').orderBy('id');
	if (o.setupId !== undefined) query.where('setup_id', o.setupId);
	if (o.setupIds) query.whereIn('setup_id', o.setupIds.length ? [...o.setupIds] : [0]);
	return (await query).map(fromRow);
}

export async function read(projectId: number, id: number, q: Knex = db): Promise<Circuit | null> {
	const row = await q('circuits').where({ project_id: projectId, id }).first();
	return row ? fromRow(row) : null;
}

export async function create(projectId: number, setupId: number, fields: CircuitFields, userId: number | null, q: Knex = db): Promise<Circuit> {
	const [id] = await q('circuits').insert({ project_id: projectId, setup_id: setupId, ...toColumns(fields), created_by: userId, updated_by: userId });
	return (await read(projectId, Number(id), q)) as Circuit;
}

export async function update(
	projectId: number,
	id: number,
	changes: Partial<CircuitFields>,
	expectedVersion: number,
	userId: number | null,
	q: Knex = db
): Promise<{ circuit: Circuit } | { conflict: Circuit } | null> {
	const n = await q('circuits')
		.where({ project_id: projectId, id, version: expectedVersion })
		.update({ ...toColumns(changes), updated_by: userId, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	const current = await read(projectId, id, q);
	if (!current) return null;
	return n === 1 ? { circuit: current } : { conflict: current };
}

/** Deletes the circuit; its lights stay, unassigned (the foreign key sets their circuit to null). */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('circuits').where({ project_id: projectId, id }).delete()) === 1;
}
