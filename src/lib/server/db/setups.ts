/** Setups: one lighting setup on a shoot day, with its target white and status. */
import { db } from './index';

/** Whether a setup with this id belongs to the project. */
export async function exists(projectId: number, id: number): Promise<boolean> {
	return Boolean(await db('setups').where({ project_id: projectId, id }).first('id'));
}
