import { dev } from '$app/environment';
import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';

// A measuring page for scripts/bench/chart.ts: exists only under `vite dev`, a 404 in any build.

export const load: PageLoad = ({ url }) => {
	if (!dev) error(404, 'Not found');
	const n = Number(url.searchParams.get('n') ?? 5000);
	return { n: Number.isInteger(n) && n > 0 && n <= 50000 ? n : 5000 };
};
