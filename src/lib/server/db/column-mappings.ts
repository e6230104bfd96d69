/** Column mappings a project saved for its meters' file layouts, reused on later uploads. */
import { db } from './index';
import { parseJson, toJson } from './json';

export interface SavedMapping {
	id: number;
	projectId: number;
	name: string;
	mapping: unknown;
	updatedAt: string;
}

type Row = Record<string, unknown>;
const fromRow = (r: Row): SavedMapping => ({
	id: r.id as number,
	projectId: r.project_id as number,
	name: r.name as string,
	mapping: parseJson(r.mapping),
	updatedAt: r.updated_at instanceof Date ? r.updated_at.toISOString() : String(r.updated_at)
});

export async function list(projectId: number): Promise<SavedMapping[]> {
	return (await db('column_mappings').where({ project_id: projectId }).orderBy('name')).map(fromRow);
}

/** Saves under a name; the same name replaces the earlier mapping. */
export async function save(projectId: number, name: string, mapping: unknown, userId: number | null): Promise<SavedMapping> {
	await db('column_mappings')
		.insert({ project_id: projectId, name, mapping: toJson(mapping), created_by: userId, updated_by: userId })
		.onConflict(['project_id', 'name'])
		.merge({ mapping: toJson(mapping), updated_by: userId, updated_at: db.fn.now(3), version: db.raw('version + 1') });
	return fromRow(await db('column_mappings').where({ project_id: projectId, name }).first());
}

export async function destroy(projectId: number, id: number): Promise<boolean> {
	return (await db('column_mappings').where({ project_id: projectId, id }).delete()) === 1;
}
