import { requireUser, ROLE_LABELS } from '$lib/server/authz';
import { listMyProjects } from '$lib/server/services/projects';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals, url);
	const projects = await listMyProjects(user);
	return {
		user: { name: user.name, email: user.email },
		projects: projects.map((p) => ({
			id: p.id,
			name: p.name,
			role: p.role,
			roleLabel: ROLE_LABELS[p.role],
			memberCount: p.memberCount,
			archived: p.archivedAt !== null,
			updatedAt: p.updatedAt
		}))
	};
};
