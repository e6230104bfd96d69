import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMPUTATION_VERSION } from '../../../src/lib/colour';
import { closeDb } from '../../../src/lib/server/db';
import * as readings from '../../../src/lib/server/db/readings';
import { createReading, recomputeStale } from '../../../src/lib/server/services/readings';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Recompute');
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('recomputing readings when the colour computation changes', () => {
	it('rebuilds the values of readings made by another version from their raw input, and only those', async () => {
		// CIE 15:2004 Table T.3: D65 x, y = 0.31272, 0.32903.
		const stale = await createReading(p.projectId, p.crew.gaffer.id, { label: 'Old', raw: { kind: 'chromaticity_xy', x: 0.31272, y: 0.32903 } });
		const current = await createReading(p.projectId, p.crew.gaffer.id, { label: 'Current', raw: { kind: 'cct_duv', cct_k: 3200, duv: 0 } });
		// Pretend an older computation stored wrong values.
		await db('readings').where({ id: stale.id }).update({ computation_version: 'chromaslate-colour-0.0.1', cct_k: 1, analysis: JSON.stringify({ ...stale.computed, cct_k: 1 }) });
		const untouchedAt = (await db('readings').where({ id: current.id }).first()).analysis;

		const n = await recomputeStale();
		expect(n).toBeGreaterThanOrEqual(1);
		const after = await readings.read(p.projectId, stale.id);
		expect(after?.computationVersion).toBe(COMPUTATION_VERSION);
		expect(after?.computed.cct_k).toBeGreaterThan(6500);
		expect(after?.computed.cct_k).toBeLessThan(6507);
		expect((await db('readings').where({ id: stale.id }).first()).cct_k).toBeCloseTo(after!.computed.cct_k!, 6);
		expect((await db('readings').where({ id: current.id }).first()).analysis).toEqual(untouchedAt);
		expect(await recomputeStale()).toBe(0);
	});
});
