/** The demo project, with every demo person on it in their role. Invented scenario, labelled as such. */
import * as members from '../../src/lib/server/db/members';
import * as projects from '../../src/lib/server/db/projects';
import { DEMO_ACCOUNTS } from './accounts';
import { need, type SeedContext } from './context';

export const DEMO_PROJECT_NAME = 'Night Wash (demo)';

export const DEMO_PROJECT_NOTES = [
	'Invented for the demo: no real people, places, fixtures or productions.',
	'A short drama shot over two nights in an invented all-night laundromat. The tube fluorescents in the ceiling stay on (the owner will not have them switched off), a sodium streetlight comes in through the front window, and a cool LED sign hangs over the counter. Day three is a studio day rebuilding the counter corner, matched to the location.'
].join('\n\n');

export async function seedDemoProject(ctx: SeedContext): Promise<void> {
	const owner = need(ctx.users.owner, 'the demo owner');
	let project = await projects.readByName(DEMO_PROJECT_NAME);
	if (!project) {
		project = await projects.create({ name: DEMO_PROJECT_NAME, notes: DEMO_PROJECT_NOTES, createdBy: owner.id });
	} else if (project.notes !== DEMO_PROJECT_NOTES || project.archivedAt) {
		project = (await projects.update(project.id, project.version, { notes: DEMO_PROJECT_NOTES, archivedAt: null })) ?? project;
	}
	for (const a of DEMO_ACCOUNTS) {
		await members.create(project.id, need(ctx.users[a.key], a.name).id, a.projectRole);
	}
	ctx.project = project;
}
