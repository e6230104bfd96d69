import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { apiRoute, apiUser, idParam } from '$lib/server/api';
import { requireProjectPermission } from '$lib/server/authz';
import { lightSpectra } from '$lib/server/services/spectra';

const query = z.object({
	reading: z.coerce.number().int().positive().optional(),
	// Filter ids, comma separated, at most three (a stack holds up to three).
	stack: z
		.string()
		.trim()
		.max(300)
		.optional()
		.transform((s) => (s ? s.split(',').map((x) => x.trim()).filter(Boolean) : []))
		.pipe(z.array(z.string().min(1).max(80)).max(3))
});

/** A light's reading against the setup's target white, and through a gel stack with the predicted spectrum. */
export const GET = apiRoute(async (event) => {
	const access = await requireProjectPermission(await apiUser(event), event.params.projectId, 'project.view');
	const q = query.parse(Object.fromEntries(event.url.searchParams));
	return json(await lightSpectra(access, idParam(event.params.lightId, 'light'), { readingId: q.reading, stackIds: q.stack }));
});
