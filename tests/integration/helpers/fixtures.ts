/** Small factories for integration tests: people, a project with members, a day, a setup, a light. */
import type { Knex } from 'knex';
import type { SessionUser } from '../../../src/lib/server/auth/types';

let seq = 0;
const unique = () => `${Date.now().toString(36)}${(seq++).toString(36)}`;

export async function makeUser(db: Knex, name: string): Promise<SessionUser> {
	const email = `${name.toLowerCase().replace(/\W+/g, '-')}-${unique()}@example.test`;
	const [id] = await db('users').insert({ email, name, email_verified: new Date() });
	return { id: Number(id), email, name, isAdmin: false };
}

export type Crew = Record<'owner' | 'dp' | 'gaffer' | 'colorist' | 'viewer' | 'stranger', SessionUser>;

export async function makeProject(db: Knex, name = 'Test project') {
	const crew = {} as Crew;
	for (const role of ['owner', 'dp', 'gaffer', 'colorist', 'viewer', 'stranger'] as const) {
		crew[role] = await makeUser(db, `Test ${role}`);
	}
	const [projectId] = await db('projects').insert({ name: `${name} ${unique()}`, created_by: crew.owner.id });
	for (const role of ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const) {
		await db('project_members').insert({ project_id: projectId, user_id: crew[role].id, role });
	}
	const [dayId] = await db('shoot_days').insert({ project_id: projectId, shoot_date: '2026-12-01', label: 'Night 1', location_name: 'Test location', mains_voltage: 230, mains_frequency: 50 });
	const [setupId] = await db('setups').insert({ project_id: projectId, shoot_day_id: dayId, name: 'Wide' });
	const [otherSetupId] = await db('setups').insert({ project_id: projectId, shoot_day_id: dayId, name: 'Close' });
	const [lightId] = await db('lights').insert({ project_id: projectId, setup_id: setupId, label: 'Key panel', role: 'key', kind: 'led-rgbw' });
	return { projectId: Number(projectId), dayId: Number(dayId), setupId: Number(setupId), otherSetupId: Number(otherSetupId), lightId: Number(lightId), crew };
}
