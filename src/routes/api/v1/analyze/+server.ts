import { json } from '@sveltejs/kit';
import { apiRoute, apiUser } from '$lib/server/api';
import { analyzeRequest } from '$lib/server/services/readings-api';

/** Stateless: a readings CSV (text/csv or multipart `file`) or JSON readings in, the analysis out. Nothing is stored. */
export const POST = apiRoute(async (event) => {
	await apiUser(event);
	return json(await analyzeRequest(event.request));
});
