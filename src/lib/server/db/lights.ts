/** Lights: one unit in a setup (its role, kind, gel stack, LED settings, dimmer, power, circuit). */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson, toJson } from './json';
import type { LedSettings, LightKind, LightRole } from '../../schemas/log';

export interface LightFields {
	label: string;
	role: LightRole;
	kind: LightKind;
	fixtureProfile: string | null;
	/** Gel names or filter ids, lamp side first. */
	gelStack: string[];
	ledSettings: LedSettings | null;
	dimmerPercent: number | null;
	powerW: number | null;
	circuitId: number | null;
	notes: string;
	position: number;
}

export interface Light extends LightFields {
	id: number;
	projectId: number;
	setupId: number;
	deletedAt: Date | null;
	version: number;
	createdBy: number | null;
	updatedBy: number | null;
	createdAt: Date;
	updatedAt: Date;
}


type Row = Record<string, unknown>;

function fromRow(r: Row): Light {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		setupId: r.setup_id as number,
		label: r.label as string,
		role: r.role as LightRole,
		kind: r.kind as LightKind,
		fixtureProfile: (r.fixture_profile as string | null) ?? null,
		gelStack: parseJson<string[]>(r.gel_stack) ?? [],
		ledSettings: parseJson<LedSettings>(r.led_settings),
		dimmerPercent: r.dimmer_percent === null || r.dimmer_percent === undefined ? null : Number(r.dimmer_percent),
		powerW: (r.power_w as number | null) ?? null,
		circuitId: (r.circuit_id as number | null) ?? null,
		notes: (r.notes as string | null) ?? '',
		position: r.position as number,
		deletedAt: (r.deleted_at as Date | null) ?? null,
		version: r.version as number,
		createdBy: (r.created_by as number | null) ?? null,
		updatedBy: (r.updated_by as number | null) ?? null,
		createdAt: r.created_at as Date,
		updatedAt: r.updated_at as Date
	};
}

function toColumns(f: Partial<LightFields>): Row {
	const row: Row = {};
	if (f.label !== undefined) row.label = f.label;
	if (f.role !== undefined) row.role = f.role;
	if (f.kind !== undefined) row.kind = f.kind;
	if (f.fixtureProfile !== undefined) row.fixture_profile = f.fixtureProfile || null;
	if (f.gelStack !== undefined) row.gel_stack = f.gelStack.length ? toJson(f.gelStack) : null;
	if (f.ledSettings !== undefined) row.led_settings = toJson(f.ledSettings);
	if (f.dimmerPercent !== undefined) row.dimmer_percent = f.dimmerPercent;
	if (f.powerW !== undefined) row.power_w = f.powerW;
	if (f.circuitId !== undefined) row.circuit_id = f.circuitId;
	if (f.notes !== undefined) row.notes = f.notes || null;
	if (f.position !== undefined) row.position = f.position;
	return row;
}

/** The setup a light of the project is in, or null when there is no such light. */
export async function setupOf(projectId: number, id: number): Promise<number | null> {
	const row = await db('lights').where({ project_id: projectId, id }).whereNull('deleted_at').first('setup_id');
	return row ? (row.setup_id as number) : null;
}

export interface ListOptions {
	setupId?: number;
	setupIds?: readonly number[];
	kind?: string;
	includeDeleted?: boolean;
}

/** Lights in rig order (position, then id). */
export async function list(projectId: number, o: ListOptions = {}, q: Knex = db): Promise<Light[]> {
	const query = q('lights').where({ project_id: projectId }).orderBy('setup_id').orderBy('position').orderBy('id');
	if (!o.includeDeleted) query.whereNull('deleted_at');
	if (o.setupId !== undefined) query.where('setup_id', o.setupId);
	if (o.setupIds) query.whereIn('setup_id', o.setupIds.length ? [...o.setupIds] : [0]);
	if (o.kind) query.where('kind', o.kind);
	return (await query).map(fromRow);
}

export async function read(projectId: number, id: number, { includeDeleted = false } = {}, q: Knex = db): Promise<Light | null> {
	const query = q('lights').where({ project_id: projectId, id });
	if (!includeDeleted) query.whereNull('deleted_at');
	const row = await query.first();
	return row ? fromRow(row) : null;
}

export type NewLight = Pick<LightFields, 'label'> & Partial<LightFields>;

export async function create(projectId: number, setupId: number, fields: NewLight, userId: number | null, q: Knex = db): Promise<Light> {
	const position = fields.position ?? Number((await q('lights').where({ setup_id: setupId }).max({ p: 'position' }).first())?.p ?? -1) + 1;
	const [id] = await q('lights').insert({ project_id: projectId, setup_id: setupId, ...toColumns({ ...fields, position }), created_by: userId, updated_by: userId });
	return (await read(projectId, Number(id), {}, q)) as Light;
}

/**
 * Applies the changes when `expectedVersion` is still current. Returns `{ light }`, `{ conflict }`
 * with the row as it now is when someone saved first, or null when the light is gone.
 */
export async function update(
	projectId: number,
	id: number,
	changes: Partial<LightFields>,
	expectedVersion: number,
	userId: number | null,
	q: Knex = db
): Promise<{ light: Light } | { conflict: Light } | null> {
	const n = await q('lights')
		.where({ project_id: projectId, id, version: expectedVersion })
		.whereNull('deleted_at')
		.update({ ...toColumns(changes), updated_by: userId, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	const current = await read(projectId, id, {}, q);
	if (!current) return null;
	return n === 1 ? { light: current } : { conflict: current };
}

/** Removes the light from its setup. The row stays (hidden) so its readings and fixes keep their history. */
export async function destroy(projectId: number, id: number, userId: number | null, q: Knex = db): Promise<boolean> {
	const n = await q('lights')
		.where({ project_id: projectId, id })
		.whereNull('deleted_at')
		.update({ deleted_at: q.fn.now(3), updated_by: userId, version: q.raw('version + 1') });
	return n === 1;
}
