/**
 * `npm run --silent analyze -- FILE.csv [--absolute]`: reads a readings CSV in any layout the
 * importer knows (src/lib/import/README.md) and prints one JSON object:
 *   {"readings":[{row,label,kind,x,y,u_prime,v_prime,cct_k,duv,cri,ssi,warnings}],"errors":[{row,column,message}]}
 * Exit 0 when the file was read (bad rows are listed in "errors"); exit 2 with a one-line message on
 * stderr when the file itself cannot be used (missing, empty, binary, no recognisable columns, too
 * large). File-level notes (unused columns…) go to stderr as "analyze: note: …".
 * `--absolute` reads spectral values as W/m²/nm instead of relative.
 */
import { readFileSync, statSync } from 'node:fs';
import { analyzeReport, DEFAULT_LIMITS, ImportError, parseReadings, toAnalyzeJson } from '../src/lib/import';

const USAGE = 'usage: npm run --silent analyze -- FILE.csv [--absolute]';

function oneLine(s: string): string {
	return s.replace(/\s*\n\s*/g, ' ').trim();
}

function fail(message: string, code = 2): never {
	process.stderr.write(`analyze: ${oneLine(message)}\n`);
	process.exit(code);
}

function main() {
	const args = process.argv.slice(2);
	if (args.includes('--help') || args.includes('-h')) {
		process.stdout.write(`${USAGE}\n`);
		return;
	}
	const unknown = args.filter((a) => a.startsWith('--') && a !== '--absolute');
	if (unknown.length > 0) fail(`unknown option ${unknown[0]}; ${USAGE}`);
	const files = args.filter((a) => !a.startsWith('--'));
	if (files.length !== 1) fail(files.length === 0 ? `no file given; ${USAGE}` : `give one file, not ${files.length}; ${USAGE}`);
	const file = files[0];

	let size: number;
	try {
		const st = statSync(file);
		if (st.isDirectory()) fail(`${file} is a folder, not a file.`);
		size = st.size;
	} catch (e) {
		const code = (e as NodeJS.ErrnoException).code;
		fail(code === 'ENOENT' ? `${file}: no such file.` : `cannot read ${file} (${code ?? 'unknown error'}).`);
	}
	if (size > DEFAULT_LIMITS.maxBytes) fail(`${file}: The file is over the size limit of 20 MB.`);
	let bytes: Uint8Array;
	try {
		const buf = readFileSync(file);
		bytes = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
	} catch (e) {
		fail(`cannot read ${file} (${(e as NodeJS.ErrnoException).code ?? 'unknown error'}).`);
	}

	let report;
	try {
		report = parseReadings(bytes, { spectralScale: args.includes('--absolute') ? 'W/m²/nm' : 'relative' });
	} catch (e) {
		if (e instanceof ImportError) fail(`${file}: ${e.message}`);
		throw e;
	}
	const json = toAnalyzeJson(analyzeReport(report));
	for (const w of report.warnings) process.stderr.write(`analyze: note: ${oneLine(w)}\n`);
	process.stdout.write(`${JSON.stringify(json)}\n`);
	process.exitCode = 0;
}

try {
	main();
} catch (e) {
	fail(`internal error: ${e instanceof Error ? e.message : String(e)}`, 1);
}
