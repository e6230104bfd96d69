/**
 * Readings import at scale: a generated 10,000-row wide spectral CSV at 5 nm (81 bands,
 * 380–780 nm), timed per stage: decode and split into records (papaparse), validate into
 * readings, and analyse every reading with the colour core (xy, u'v', CCT, Duv, CRI, SSI).
 * The spectra are invented smooth shapes (a warm blackbody-like slope plus a bump), one per row.
 * A 1,000-row file goes through first to warm up the JIT; the figures are one run, wall time.
 */
import { analyzeReport, parseRows, readRecords } from '../../src/lib/import';

export const title = 'Readings import: 10,000-row wide spectral CSV at 5 nm (parse, validate, analyse)';

function generate(rows: number): Uint8Array {
	const nm: number[] = [];
	for (let n = 380; n <= 780; n += 5) nm.push(n);
	const lines = [['label', 'taken_at', 'lux', ...nm].join(',')];
	for (let r = 0; r < rows; r++) {
		const tilt = 0.5 + (r % 50) / 25;
		const peak = 450 + (r % 7) * 20;
		const values = nm.map((n) => (20 + 80 * tilt * ((n - 380) / 400) + 40 * Math.exp(-(((n - peak) / 25) ** 2))).toFixed(4));
		lines.push([`Reading ${r + 1}`, '2026-03-01T21:30', String(100 + r), ...values].join(','));
	}
	return new TextEncoder().encode(`${lines.join('\n')}\n`);
}

const seconds = (t0: number) => (performance.now() - t0) / 1000;

export async function run() {
	// Warm up the JIT on a small file first, as a running server would be.
	const warm = readRecords(generate(1_000));
	analyzeReport(parseRows(warm.rows, warm));

	const bytes = generate(10_000);
	let t0 = performance.now();
	const records = readRecords(bytes);
	const parse = seconds(t0);
	t0 = performance.now();
	const report = parseRows(records.rows, records);
	const validate = seconds(t0);
	t0 = performance.now();
	const result = analyzeReport(report);
	const analyze = seconds(t0);
	if (report.readings.length !== 10_000 || result.readings.length !== 10_000 || result.errors.length > 0) {
		throw new Error(`expected 10,000 clean readings, got ${result.readings.length} and ${result.errors.length} errors`);
	}
	return {
		import_10k_parse_s: { value: parse, unit: 's', label: `decode + split ${(bytes.length / 1e6).toFixed(1)} MB into records` },
		import_10k_validate_s: { value: validate, unit: 's', label: 'validate rows into 10,000 spectra' },
		import_10k_analyze_s: { value: analyze, unit: 's', label: "analyse 10,000 spectra (xy, u'v', CCT, CRI, SSI)" },
		import_10k_total_s: { value: parse + validate + analyze, unit: 's', label: 'total (parse + validate + analyse)' }
	};
}
