/** Read-only: the setups and lights of a project a reading can be assigned to, for pickers. */
import { db } from './index';

export interface AssignableSetup {
	id: number;
	name: string;
	day: string;
	lights: { id: number; label: string; role: string }[];
}

export async function list(projectId: number): Promise<AssignableSetup[]> {
	const setups = await db('setups as s')
		.join('shoot_days as d', 'd.id', 's.shoot_day_id')
		.where('s.project_id', projectId)
		.orderBy([{ column: 'd.shoot_date' }, { column: 's.position' }, { column: 's.id' }])
		.select('s.id', 's.name', 'd.label as day_label', 'd.shoot_date');
	const lights = await db('lights').where({ project_id: projectId }).whereNull('deleted_at').orderBy(['setup_id', 'position', 'id']).select('id', 'setup_id', 'label', 'role');
	return setups.map((s) => ({
		id: s.id,
		name: s.name,
		day: s.day_label || (s.shoot_date instanceof Date ? s.shoot_date.toISOString().slice(0, 10) : String(s.shoot_date)),
		lights: lights.filter((l) => l.setup_id === s.id).map((l) => ({ id: l.id, label: l.label, role: l.role }))
	}));
}
