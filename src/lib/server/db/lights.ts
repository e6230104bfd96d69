/** Lights: one unit in a setup (its role, kind, gel stack, LED settings, dimmer, power, circuit). */
import { db } from './index';

/** The setup a light of the project is in, or null when there is no such light. */
export async function setupOf(projectId: number, id: number): Promise<number | null> {
	const row = await db('lights').where({ project_id: projectId, id }).whereNull('deleted_at').first('setup_id');
	return row ? (row.setup_id as number) : null;
}
