/** Shoot days: one day of the project, with its location and mains supply (voltage, frequency). */
import type { Knex } from 'knex';
import { db } from './index';

export interface ShootDay {
	id: number;
	projectId: number;
	/** YYYY-MM-DD */
	date: string;
	label: string;
	locationName: string;
	mainsVoltage: number;
	mainsFrequency: number;
	notes: string;
	version: number;
	createdBy: number | null;
	updatedBy: number | null;
	createdAt: Date;
	updatedAt: Date;
}

export interface ShootDayFields {
	date: string;
	label: string;
	locationName: string;
	mainsVoltage: number;
	mainsFrequency: number;
	notes: string;
}

type Row = Record<string, unknown>;

/** A DATE column as YYYY-MM-DD (mysql2 hands DATE back as a Date at UTC midnight: the pool runs in UTC). */
export function dateOnly(v: unknown): string {
	if (v instanceof Date) return v.toISOString().slice(0, 10);
	return String(v).slice(0, 10);
}

function fromRow(r: Row): ShootDay {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		date: dateOnly(r.shoot_date),
		label: (r.label as string) ?? '',
		locationName: (r.location_name as string) ?? '',
		mainsVoltage: r.mains_voltage as number,
		mainsFrequency: r.mains_frequency as number,
		notes: (r.notes as string | null) ?? '',
		version: r.version as number,
		createdBy: (r.created_by as number | null) ?? null,
		updatedBy: (r.updated_by as number | null) ?? null,
		createdAt: r.created_at as Date,
		updatedAt: r.updated_at as Date
	};
}

function toColumns(f: Partial<ShootDayFields>): Row {
	const row: Row = {};
	if (f.date !== undefined) row.shoot_date = f.date;
	if (f.label !== undefined) row.label = f.label;
	if (f.locationName !== undefined) row.location_name = f.locationName;
	if (f.mainsVoltage !== undefined) row.mains_voltage = f.mainsVoltage;
	if (f.mainsFrequency !== undefined) row.mains_frequency = f.mainsFrequency;
	if (f.notes !== undefined) row.notes = f.notes || null;
	return row;
}

export const SORTABLE = ['date', 'label', 'location', 'setups'] as const;
export type SortKey = (typeof SORTABLE)[number];
const SORT_COLUMNS: Record<SortKey, string> = { date: 'd.shoot_date', label: 'd.label', location: 'd.location_name', setups: 'setup_count' };

export interface ListOptions {
	/** Matches label, location or notes. */
	q?: string;
	sort?: SortKey;
	order?: 'asc' | 'desc';
	limit?: number;
	offset?: number;
}

export interface ShootDaySummary extends ShootDay {
	setupCount: number;
	lightCount: number;
}

export async function list(projectId: number, o: ListOptions = {}, q: Knex = db): Promise<{ items: ShootDaySummary[]; total: number }> {
	const base = q('shoot_days as d').where('d.project_id', projectId);
	if (o.q?.trim()) {
		const like = `%${o.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		base.where((w) => w.where('d.label', 'like', like).orWhere('d.location_name', 'like', like).orWhere('d.notes', 'like', like));
	}
	const [{ n }] = (await base.clone().count({ n: '*' })) as { n: number }[];
	const order = o.order ?? 'asc';
	const rows = await base
		.select('d.*')
		.select(q.raw('(SELECT COUNT(*) FROM setups s WHERE s.shoot_day_id = d.id) AS setup_count'))
		.select(q.raw('(SELECT COUNT(*) FROM lights l JOIN setups s ON s.id = l.setup_id WHERE s.shoot_day_id = d.id AND l.deleted_at IS NULL) AS light_count'))
		.orderBy(SORT_COLUMNS[o.sort ?? 'date'], order)
		.orderBy('d.id', order)
		.limit(o.limit ?? 1000)
		.offset(o.offset ?? 0);
	return {
		items: rows.map((r: Row) => ({ ...fromRow(r), setupCount: Number(r.setup_count), lightCount: Number(r.light_count) })),
		total: Number(n)
	};
}

export async function read(projectId: number, id: number, q: Knex = db): Promise<ShootDay | null> {
	const row = await q('shoot_days').where({ project_id: projectId, id }).first();
	return row ? fromRow(row) : null;
}

export async function create(projectId: number, fields: ShootDayFields, userId: number | null, q: Knex = db): Promise<ShootDay> {
	const [id] = await q('shoot_days').insert({ project_id: projectId, ...toColumns(fields), created_by: userId, updated_by: userId });
	return (await read(projectId, Number(id), q)) as ShootDay;
}

/**
 * Applies the changes when `expectedVersion` is still current. Returns `{ day }`, `{ conflict }` with
 * the row as it now is when someone saved first, or null when the day is gone.
 */
export async function update(
	projectId: number,
	id: number,
	changes: Partial<ShootDayFields>,
	expectedVersion: number,
	userId: number | null,
	q: Knex = db
): Promise<{ day: ShootDay } | { conflict: ShootDay } | null> {
	const n = await q('shoot_days')
		.where({ project_id: projectId, id, version: expectedVersion })
		.update({ ...toColumns(changes), updated_by: userId, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	const current = await read(projectId, id, q);
	if (!current) return null;
	return n === 1 ? { day: current } : { conflict: current };
}

/** Deletes the day with its setups, lights and circuits (readings stay, unassigned). */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('shoot_days').where({ project_id: projectId, id }).delete()) === 1;
}
