import { parseSeed } from '$lib/components/lab/worksheet';
import type { PageLoad } from './$types';

// Public teaching page: no sign-in. `?set=N` picks the worksheet's exercises, so a sheet can be shared.
export const load: PageLoad = ({ url }) => ({ seed: parseSeed(url.searchParams.get('set')) });
