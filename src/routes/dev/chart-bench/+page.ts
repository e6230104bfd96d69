import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';

// A measuring page for scripts/bench/chart.ts: exists only under `vite dev` (mode "development"),
// a 404 in any build, whatever NODE_ENV the build ran with.
export const load: PageLoad = ({ url }) => {
	if (import.meta.env.MODE !== 'development') error(404, 'Not found');
	const n = Number(url.searchParams.get('n') ?? 5000);
	return { n: Number.isInteger(n) && n > 0 && n <= 50000 ? n : 5000 };
};
