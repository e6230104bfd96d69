/**
 * Fixture profiles made from measured channel spectra: shared (projectId null) or one project's.
 * Lights name a profile by its key. Channels are stored on one wavelength grid, with each channel's
 * maximum output when one was given; the uploaded file is kept as received.
 */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson } from './json';
import type { Scope, StoredSpectrum } from './custom-gels';

export type { Scope } from './custom-gels';
const scopeId = (s: Scope) => s ?? 0;

export interface StoredChannel {
	id: string;
	label: string;
	spectrum: StoredSpectrum;
	/** Relative luminous flux at full (the spectrum is rescaled to it); null when used as measured. */
	maxFlux: number | null;
}

export type OutputBasis = 'max_output' | 'as_measured';

export interface FixtureProfileRow {
	id: number;
	projectId: number | null;
	key: string;
	name: string;
	notes: string;
	channels: StoredChannel[];
	outputBasis: OutputBasis;
	originalName: string;
	sha256: string;
	createdBy: number | null;
	createdByName: string | null;
	createdAt: Date;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): FixtureProfileRow {
	return {
		id: Number(r.id),
		projectId: r.project_id === null || r.project_id === undefined ? null : Number(r.project_id),
		key: String(r.profile_key),
		name: String(r.name),
		notes: String(r.notes ?? ''),
		channels: parseJson<StoredChannel[]>(r.channels) ?? [],
		outputBasis: r.output_basis as OutputBasis,
		originalName: String(r.original_name ?? ''),
		sha256: String(r.sha256),
		createdBy: r.created_by === null || r.created_by === undefined ? null : Number(r.created_by),
		createdByName: (r.created_by_name as string | null) ?? null,
		createdAt: r.created_at as Date
	};
}

function select(q: Knex) {
	return q('library_fixture_profiles as f')
		.leftJoin('users as u', 'u.id', 'f.created_by')
		.select(
			'f.id',
			'f.project_id',
			'f.profile_key',
			'f.name',
			'f.notes',
			'f.channels',
			'f.output_basis',
			'f.original_name',
			'f.sha256',
			'f.created_by',
			'f.created_at',
			q.raw("COALESCE(NULLIF(u.name, ''), u.email) AS created_by_name")
		);
}

export async function list(scope: Scope, q: Knex = db): Promise<FixtureProfileRow[]> {
	const rows = await select(q).where('f.scope_id', scopeId(scope)).orderBy('f.id');
	return rows.map(fromRow);
}

export async function count(scope: Scope, q: Knex = db): Promise<number> {
	const r = await q('library_fixture_profiles').where('scope_id', scopeId(scope)).count({ n: '*' }).first();
	return Number(r?.n ?? 0);
}

export async function read(scope: Scope, id: number, q: Knex = db): Promise<FixtureProfileRow | null> {
	const row = await select(q).where({ 'f.scope_id': scopeId(scope), 'f.id': id }).first();
	return row ? fromRow(row) : null;
}

/** The scope's profile with this key (keys compare as the column's collation does: case-insensitively). */
export async function readByKey(scope: Scope, key: string, q: Knex = db): Promise<FixtureProfileRow | null> {
	const row = await select(q).where({ 'f.scope_id': scopeId(scope), 'f.profile_key': key }).first();
	return row ? fromRow(row) : null;
}

export async function nameTaken(scope: Scope, name: string, q: Knex = db): Promise<boolean> {
	return (await q('library_fixture_profiles').where({ scope_id: scopeId(scope), name }).first('id')) !== undefined;
}

export interface NewFixtureProfile {
	key: string;
	name: string;
	notes: string;
	channels: StoredChannel[];
	outputBasis: OutputBasis;
	originalName: string;
	sha256: string;
	sourceCsv: Uint8Array;
}

export async function create(scope: Scope, f: NewFixtureProfile, userId: number | null, q: Knex = db): Promise<FixtureProfileRow> {
	const [id] = await q('library_fixture_profiles').insert({
		project_id: scope,
		scope_id: scopeId(scope),
		profile_key: f.key,
		name: f.name,
		notes: f.notes || null,
		channels: JSON.stringify(f.channels),
		output_basis: f.outputBasis,
		original_name: f.originalName.slice(0, 255),
		sha256: f.sha256,
		source_csv: Buffer.from(f.sourceCsv),
		created_by: userId,
		updated_by: userId
	});
	return (await read(scope, Number(id), q)) as FixtureProfileRow;
}

export async function destroy(scope: Scope, id: number, q: Knex = db): Promise<boolean> {
	return (await q('library_fixture_profiles').where({ scope_id: scopeId(scope), id }).delete()) > 0;
}
