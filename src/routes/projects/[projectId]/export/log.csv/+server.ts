import { projectAccess } from '$lib/server/authz';
import { exportFileName, logCsv } from '$lib/server/services/export';
import { reviewQuerySchema } from '$lib/schemas/log';
import type { RequestHandler } from './$types';

/** The lighting log as CSV (the review's filters apply: ?day=, ?setup=, ?kind=). */
export const GET: RequestHandler = async (event) => {
	const access = await projectAccess(event, 'export.create');
	const q = reviewQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const csv = await logCsv(access, { dayId: q.day, setupId: q.setup, kind: q.kind || undefined });
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${exportFileName(access.project.name, 'lighting-log', 'csv')}"`,
			'cache-control': 'no-store'
		}
	});
};
