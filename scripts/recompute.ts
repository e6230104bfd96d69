/**
 * Recomputes readings whose stored values came from an older version of the colour computation
 * (`COMPUTATION_VERSION`), from their raw input. `npm start` runs it after migrating; it does nothing
 * when every reading is current.
 *
 *   node --import tsx scripts/recompute.ts      (DB_* from the environment)
 */
import { closeDb } from '../src/lib/server/db';
import { recomputeStale } from '../src/lib/server/services/readings';

try {
	const n = await recomputeStale();
	if (n > 0) console.error(`[chromaslate] Recomputed ${n} reading${n === 1 ? '' : 's'} with the current colour computation.`);
} finally {
	await closeDb();
}
