/**
 * Accepted fixes: a gel stack or LED levels the DP or gaffer took for one light, recorded as the
 * light's setting at that moment, with the prediction and target it was made for, who and when.
 */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson, toJson } from './json';

export type FixKind = 'gel' | 'led';

export interface AcceptedFix {
	id: number;
	projectId: number;
	setupId: number;
	lightId: number;
	kind: FixKind;
	/** Gel fix: `{ stack: string[] }`; LED fix: `{ levels: Record<string, number>, … }` (as proposed). */
	fix: Record<string, unknown>;
	/** The predicted result at the time (e.g. `{ x, y, cct_k, duv, duv_prime }`), or null. */
	predicted: Record<string, unknown> | null;
	/** The target white it aimed at, as stored on the setup then. */
	target: Record<string, unknown> | null;
	note: string;
	acceptedBy: number | null;
	acceptedByName: string | null;
	acceptedAt: Date;
}

export interface NewFix {
	setupId: number;
	lightId: number;
	kind: FixKind;
	fix: Record<string, unknown>;
	predicted?: Record<string, unknown> | null;
	target?: Record<string, unknown> | null;
	note?: string | null;
	acceptedBy: number | null;
	acceptedAt?: Date;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): AcceptedFix {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		setupId: r.setup_id as number,
		lightId: r.light_id as number,
		kind: r.kind as FixKind,
		fix: parseJson<Record<string, unknown>>(r.fix) ?? {},
		predicted: parseJson<Record<string, unknown>>(r.predicted),
		target: parseJson<Record<string, unknown>>(r.target),
		note: (r.note as string | null) ?? '',
		acceptedBy: (r.accepted_by as number | null) ?? null,
		acceptedByName: r.accepted_email ? ((r.accepted_name as string) || (r.accepted_email as string)) : null,
		acceptedAt: r.accepted_at as Date
	};
}

function base(q: Knex) {
	return q('accepted_fixes as f').leftJoin('users as u', 'u.id', 'f.accepted_by').select('f.*', 'u.name as accepted_name', 'u.email as accepted_email');
}

/** Newest first. */
export async function list(projectId: number, o: { setupId?: number; lightId?: number } = {}, q: Knex = db): Promise<AcceptedFix[]> {
	const query = base(q).where('f.project_id', projectId).orderBy('f.accepted_at', 'desc').orderBy('f.id', 'desc');
	if (o.setupId !== undefined) query.where('f.setup_id', o.setupId);
	if (o.lightId !== undefined) query.where('f.light_id', o.lightId);
	return (await query).map(fromRow);
}

export async function read(projectId: number, id: number, q: Knex = db): Promise<AcceptedFix | null> {
	const row = await base(q).where({ 'f.project_id': projectId, 'f.id': id }).first();
	return row ? fromRow(row) : null;
}

/** The latest accepted fix of each light (of one setup, or of the whole project), keyed by light id. */
export async function latestByLight(projectId: number, o: { setupId?: number } = {}, q: Knex = db): Promise<Map<number, AcceptedFix>> {
	const all = await list(projectId, o, q);
	const out = new Map<number, AcceptedFix>();
	for (const f of all) if (!out.has(f.lightId)) out.set(f.lightId, f);
	return out;
}

export async function create(projectId: number, f: NewFix, q: Knex = db): Promise<AcceptedFix> {
	const [id] = await q('accepted_fixes').insert({
		project_id: projectId,
		setup_id: f.setupId,
		light_id: f.lightId,
		kind: f.kind,
		fix: toJson(f.fix),
		predicted: toJson(f.predicted ?? null),
		target: toJson(f.target ?? null),
		note: f.note || null,
		accepted_by: f.acceptedBy,
		...(f.acceptedAt ? { accepted_at: f.acceptedAt } : {})
	});
	return (await read(projectId, Number(id), q)) as AcceptedFix;
}

/** Removes one record (an acceptance made by mistake); fixes otherwise go only with their light or setup. */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('accepted_fixes').where({ project_id: projectId, id }).delete()) === 1;
}
