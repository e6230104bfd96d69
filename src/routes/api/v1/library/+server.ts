import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/api';
import { sharedLibrary } from '$lib/server/services/library';

/**
 * The shared library: every built-in filter (nominal figures, disputed ranges, modelled curve, effect
 * on 3200 K and 5600 K), the shared custom filters, and the generic and shared fixture profiles.
 * Readable without signing in, like the mired lab: it holds no project's data.
 */
export const GET = apiRoute(async () => json(await sharedLibrary()));
