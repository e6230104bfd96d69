import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cieIlluminant } from '../../../src/lib/colour';

const ROOT = resolve(__dirname, '../../..');
const FIXTURES = join(ROOT, 'tests/fixtures/import');

interface Run {
	code: number;
	stdout: string;
	stderr: string;
}

function analyze(file: string): Promise<Run> {
	return new Promise((done) => {
		execFile('npx', ['tsx', 'scripts/analyze.ts', file], { cwd: ROOT, timeout: 120_000 }, (err, stdout, stderr) => {
			const code = err ? (typeof err.code === 'number' ? err.code : -1) : 0;
			done({ code, stdout, stderr });
		});
	});
}

/** A wide spectral CSV of CIE illuminant A at 5 nm over 380–780 nm, from the colour core's table. */
function illuminantACsv(): string {
	const a = cieIlluminant('A');
	const nm: number[] = [];
	for (let n = 380; n <= 780; n += 5) nm.push(n);
	const at = (n: number) => a.values[Math.round((n - a.start) / a.interval)];
	return `label,${nm.join(',')}\nIlluminant A,${nm.map(at).join(',')}\n`;
}

let dir: string;
const runs: Record<string, Run> = {};

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'chromaslate-analyze-'));
	writeFileSync(join(dir, 'illuminant-a.csv'), illuminantACsv());
	const files: Record<string, string> = {
		a: join(dir, 'illuminant-a.csv'),
		xy: join(FIXTURES, 'chromaticity-xy.csv'),
		cct: join(FIXTURES, 'semicolon-cct-duv.csv'),
		latin1: join(FIXTURES, 'latin1-uv-prime.csv'),
		xyz: join(FIXTURES, 'tab-tristimulus-bom.csv'),
		empty: join(FIXTURES, 'empty.csv'),
		binary: join(FIXTURES, 'binary.png'),
		unrecognised: join(FIXTURES, 'unrecognised.csv'),
		missing: join(dir, 'no-such-file.csv')
	};
	// Two at a time: the machine is shared.
	const names = Object.keys(files);
	for (let i = 0; i < names.length; i += 2) {
		await Promise.all(names.slice(i, i + 2).map(async (n) => (runs[n] = await analyze(files[n]))));
	}
}, 600_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

const READING_KEYS = ['row', 'label', 'kind', 'x', 'y', 'u_prime', 'v_prime', 'cct_k', 'duv', 'cri', 'ssi', 'warnings'];

describe('npm run analyze', () => {
	it('CIE 15:2004 Table T.3: a 5 nm wide CSV of illuminant A gives x, y = 0.44758, 0.40745', () => {
		const r = runs.a;
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(Object.keys(out)).toEqual(['readings', 'errors']);
		expect(out.errors).toEqual([]);
		const a = out.readings[0];
		expect(Object.keys(a)).toEqual(READING_KEYS);
		expect(a).toMatchObject({ row: 1, label: 'Illuminant A', kind: 'spectral' });
		expect(Math.abs(a.x - 0.44758)).toBeLessThan(5e-5);
		expect(Math.abs(a.y - 0.40745)).toBeLessThan(5e-5);
		expect(a.cri.r).toHaveLength(15);
		expect(typeof a.cri.ra).toBe('number');
		expect(typeof a.ssi).toBe('number');
	});

	it('CIE 15:2004 §3.1: the D65 xy row gives CCT ≈ 6504 K; bad rows go to errors with exit 0', () => {
		const r = runs.xy;
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(out.readings.map((x: { row: number }) => x.row)).toEqual([1, 2, 5]);
		const d65 = out.readings[0];
		expect(Object.keys(d65)).toEqual(READING_KEYS);
		expect(d65.kind).toBe('chromaticity');
		expect(Math.abs(d65.cct_k - 6504)).toBeLessThan(2);
		expect(d65.cri).toBeNull();
		expect(d65.ssi).toBeNull();
		expect(out.errors).toEqual([
			{ row: 3, column: 'x', message: 'row 3: x = 1.4 is outside 0–1' },
			{ row: 4, column: 'y', message: 'row 4: y is empty' }
		]);
	});

	it('reads semicolons with decimal commas (cct_duv), Latin-1 labels and tab-separated XYZ with a BOM', () => {
		const cct = JSON.parse(runs.cct.stdout);
		expect(runs.cct.code).toBe(0);
		expect(cct.readings.map((x: { kind: string; label: string }) => [x.kind, x.label])).toEqual([
			['cct_duv', 'Key'],
			['cct_duv', 'Practical']
		]);
		expect(Math.abs(cct.readings[0].cct_k - 5600)).toBeLessThan(1);
		expect(cct.errors[0]).toMatchObject({ row: 3, column: 'duv' });

		const latin1 = JSON.parse(runs.latin1.stdout);
		expect(latin1.readings[0].label).toBe('Façade');
		expect(latin1.readings[0].kind).toBe('chromaticity');

		const xyz = JSON.parse(runs.xyz.stdout);
		expect(xyz.readings[0].kind).toBe('tristimulus');
		// Common practice: the D65 white point (95.047, 100, 108.883) sits at D65 xy.
		expect(xyz.readings[0].x).toBeCloseTo(0.31272, 4);
		expect(xyz.errors).toEqual([{ row: 2, column: 'X', message: 'row 2: X = -1 is negative' }]);
	});

	it.each([
		['empty', /The file is empty\./],
		['binary', /binary data/],
		['unrecognised', /No recognisable columns/],
		['missing', /no such file/]
	])('refuses the %s file with exit 2 and one line on stderr', (name, message) => {
		const r = runs[name];
		expect(r.code).toBe(2);
		expect(r.stdout).toBe('');
		const lines = r.stderr.trimEnd().split('\n');
		expect(lines).toHaveLength(1);
		expect(lines[0]).toMatch(/^analyze: /);
		expect(lines[0]).toMatch(message);
		expect(r.stderr).not.toMatch(/\bat .+:\d+:\d+/);
	});
});
