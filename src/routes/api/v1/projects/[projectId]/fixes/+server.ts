import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { apiRoute, apiUser, jsonBody } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { proposeFixes } from '$lib/server/services/fixes';

const body = z.object({
	lightId: z.number().int().positive(),
	kind: z.enum(['gel', 'led']),
	fixtureId: z.string().trim().min(1).max(80).optional(),
	optimise: z.enum(['output', 'Ra', 'SSI']).optional(),
	minOutput: z.number().gt(0).max(1).optional(),
	maxGels: z.number().int().min(1).max(3).optional(),
	top: z.number().int().min(1).max(20).optional(),
	includeNeutralDensity: z.boolean().optional()
});

/** Proposed fixes for one light toward its setup's target white (nothing is stored). */
export const POST = apiRoute(async (event) => {
	const user = await apiUser(event);
	const { project } = await requireProjectPermission(user, event.params.projectId, 'fix.request');
	return json(await proposeFixes(project.id, await jsonBody(event.request, body)));
});
