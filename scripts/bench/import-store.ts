/**
 * Readings import end to end, as the server does it when a person confirms an upload: the stored
 * file is parsed, validated, analysed and its 10,000 readings inserted in one transaction. Needs the
 * bench database that `npm run bench` starts (DB_* in the environment). Also times the store stage
 * alone (inserting 10,000 analysed spectral readings).
 */
import { closeDb, db } from '../../src/lib/server/db';
import * as readings from '../../src/lib/server/db/readings';
import * as uploads from '../../src/lib/server/db/uploads';
import { confirmUpload } from '../../src/lib/server/services/readings';

export const title = 'Readings import into MariaDB: 10,000-row wide spectral CSV at 5 nm, end to end';

function generate(rows: number): Uint8Array {
	const nm: number[] = [];
	for (let n = 380; n <= 780; n += 5) nm.push(n);
	const lines = [['label', 'taken_at', ...nm].join(',')];
	for (let r = 0; r < rows; r++) {
		const tilt = 0.5 + (r % 50) / 25;
		const peak = 450 + (r % 7) * 20;
		lines.push([`Bench ${r + 1}`, '2026-03-01T21:30', ...nm.map((n) => (20 + 80 * tilt * ((n - 380) / 400) + 40 * Math.exp(-(((n - peak) / 25) ** 2))).toFixed(4))].join(','));
	}
	return new TextEncoder().encode(`${lines.join('\n')}\n`);
}

const seconds = (t0: number) => (performance.now() - t0) / 1000;

export async function run() {
	const [projectId] = await db('projects').insert({ name: `Bench ${Date.now()}` });
	try {
		// Warm up (JIT, colour tables, the connection pool) on a small file.
		const warm = await uploads.create({ projectId, filename: 'warm.csv', contentType: 'text/csv', bytes: generate(500), uploadedBy: null });
		await confirmUpload(projectId, warm.id, null);

		const bytes = generate(10_000);
		const upload = await uploads.create({ projectId, filename: 'bench.csv', contentType: 'text/csv', bytes, uploadedBy: null });
		let t0 = performance.now();
		const { imported } = await confirmUpload(projectId, upload.id, null);
		const total = seconds(t0);
		if (imported !== 10_000) throw new Error(`expected 10,000 readings, imported ${imported}`);

		// The store stage alone: the same 10,000 analysed readings inserted again in one transaction.
		const stored = (await readings.list(projectId, { limit: 10_000 })).items.filter((r) => r.uploadId === upload.id);
		const rows = stored.map((r) => ({ ...r, raw: r.raw, computed: r.computed, createdBy: null, uploadId: null }));
		t0 = performance.now();
		await db.transaction((trx) => readings.createMany(rows, trx));
		const store = seconds(t0);
		return {
			import_10k_spectral_s: { value: total, unit: 's', label: `parse + validate + analyse + store (${(bytes.length / 1e6).toFixed(1)} MB)` },
			import_10k_store_s: { value: store, unit: 's', label: 'store stage alone: insert 10,000 readings in one transaction' }
		};
	} finally {
		await db('projects').where({ id: projectId }).delete();
		await closeDb();
	}
}
