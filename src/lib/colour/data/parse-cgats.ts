/**
 * Reader for the CGATS-like text files shipped by colord-data (`*.sp`, `*.cmf`).
 *
 * The files have `KEYWORD value` header lines, a `BEGIN_DATA_FORMAT … END_DATA_FORMAT` block
 * naming the fields (`SPEC_380` for 380 nm; Illuminant A writes `SPEC_380000` in pm), and a
 * `BEGIN_DATA … END_DATA` block with one whitespace-separated row per set. The test-colour-sample
 * file adds a leading `SAMPLE_ID` field. Used by scripts/build-colour-data.ts and by the data test.
 */

export interface CgatsTable {
	header: Record<string, string>;
	/** Wavelengths in nm, one per spectral field, in file order. */
	wavelengths: number[];
	/** One row per data set; spectral values only, in the order of `wavelengths`. */
	rows: number[][];
	/** SAMPLE_ID of each row when the file has one. */
	ids: (string | null)[];
}

export function parseCgats(text: string): CgatsTable {
	const formatMatch = /BEGIN_DATA_FORMAT\s*\n([\s\S]*?)\nEND_DATA_FORMAT/.exec(text);
	const dataMatch = /\nBEGIN_DATA\s*\n([\s\S]*?)\nEND_DATA\b/.exec(text);
	if (!formatMatch || !dataMatch) throw new Error('not a CGATS-like file: no BEGIN_DATA_FORMAT or BEGIN_DATA block');
	const header: Record<string, string> = {};
	for (const line of text.slice(0, formatMatch.index).split('\n')) {
		const m = /^(\w+)\s+(.*?)\s*$/.exec(line);
		if (m) header[m[1]] = m[2].replace(/^"(.*)"$/, '$1');
	}
	const fields = formatMatch[1].trim().split(/\s+/);
	const idColumn = fields.indexOf('SAMPLE_ID');
	const spectral: { column: number; nm: number }[] = [];
	fields.forEach((f, column) => {
		const m = /^SPEC_(\d+)$/.exec(f);
		if (!m) return;
		const raw = Number(m[1]);
		// colord writes most files in nm and Illuminant A in pm (SPEC_300000 = 300 nm).
		spectral.push({ column, nm: raw >= 10000 ? raw / 1000 : raw });
	});
	const rows: number[][] = [];
	const ids: (string | null)[] = [];
	for (const line of dataMatch[1].split('\n')) {
		if (line.trim() === '') continue;
		const cells = line.trim().split(/\s+/);
		if (cells.length !== fields.length) {
			throw new Error(`data row has ${cells.length} fields, format names ${fields.length}`);
		}
		rows.push(
			spectral.map(({ column }) => {
				const v = Number(cells[column]);
				if (!Number.isFinite(v)) throw new Error(`not a number: ${cells[column]}`);
				return v;
			})
		);
		ids.push(idColumn >= 0 ? cells[idColumn] : null);
	}
	return { header, wavelengths: spectral.map((s) => s.nm), rows, ids };
}

/** Checks that wavelengths are uniform and returns { start, interval }; throws otherwise. */
export function uniformGrid(wavelengths: number[]): { start: number; interval: number } {
	if (wavelengths.length < 2) throw new Error('fewer than two wavelengths');
	const interval = wavelengths[1] - wavelengths[0];
	for (let i = 1; i < wavelengths.length; i++) {
		if (Math.abs(wavelengths[i] - wavelengths[i - 1] - interval) > 1e-9) {
			throw new Error(`non-uniform wavelengths at ${wavelengths[i]} nm`);
		}
	}
	return { start: wavelengths[0], interval };
}
