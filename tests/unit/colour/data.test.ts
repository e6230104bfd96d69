import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { F10_CORRECTIONS, ILLUMINANT_FILES, OUT_DIR, RAW_DIR, renderColourDataModules } from '../../../scripts/build-colour-data';
import { CIE1931_2_5NM, CIE1964_10_5NM } from '../../../src/lib/colour/data/cmfs';
import { DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2 } from '../../../src/lib/colour/data/daylight';
import { CIE_ILLUMINANT_TABLES } from '../../../src/lib/colour/data/illuminants';
import { parseCgats, uniformGrid } from '../../../src/lib/colour/data/parse-cgats';
import { TEST_COLOUR_SAMPLES, TEST_COLOUR_SAMPLE_IDS } from '../../../src/lib/colour/data/tcs';

const raw = (p: string) => readFileSync(join(RAW_DIR, p), 'utf8');
const RAW_FILES = [
	'cmf/CIE1931-2deg-XYZ.cmf',
	'cmf/CIE1964-10deg-XYZ.cmf',
	'ref/CIE-1986-daylight-SPD.cmf',
	'ref/CIE-TCS.sp',
	...ILLUMINANT_FILES.map((n) => `illuminant/CIE-${n}.sp`)
];

describe('generated data modules', () => {
	it('equal what scripts/build-colour-data.ts renders from data/colord (regenerate with npm run build:data)', () => {
		for (const [file, text] of Object.entries(renderColourDataModules())) {
			expect(readFileSync(join(OUT_DIR, file), 'utf8'), file).toBe(text);
		}
	});

	it('colour-matching functions equal the raw colord tables value for value', () => {
		for (const [file, t] of [
			['cmf/CIE1931-2deg-XYZ.cmf', CIE1931_2_5NM],
			['cmf/CIE1964-10deg-XYZ.cmf', CIE1964_10_5NM]
		] as const) {
			const r = parseCgats(raw(file));
			expect(uniformGrid(r.wavelengths)).toEqual({ start: t.start, interval: t.interval });
			expect(t.x).toEqual(r.rows[0]);
			expect(t.y).toEqual(r.rows[1]);
			expect(t.z).toEqual(r.rows[2]);
		}
	});

	it('CIE 15:2004 Table T.4: CIE 1931 ȳ(555 nm) = 1 and x̄(600 nm) = 1.0622 in the colord table', () => {
		expect(CIE1931_2_5NM.y[(555 - 360) / 5]).toBe(1);
		expect(CIE1931_2_5NM.x[(600 - 360) / 5]).toBe(1.0622);
		expect(CIE1931_2_5NM.x.length).toBe(95);
	});

	it('illuminants are the raw tables ×100, F10 corrected at 385 and 605 nm only', () => {
		for (const name of ILLUMINANT_FILES) {
			const r = parseCgats(raw(`illuminant/CIE-${name}.sp`));
			const t = CIE_ILLUMINANT_TABLES[name];
			expect(uniformGrid(r.wavelengths)).toEqual({ start: t.start, interval: t.interval });
			r.rows[0].forEach((v, i) => {
				const nm = t.start + i * t.interval;
				const expected = name === 'F10' && nm in F10_CORRECTIONS ? F10_CORRECTIONS[nm] : v * 100;
				expect(t.values[i], `${name} ${nm} nm`).toBeCloseTo(expected, 9);
			});
		}
	});

	it('CIE 15:2004 Table T.6: F10 is 0.80 at 385 nm and 8.31 at 605 nm (colord has 0.63 and 8.81)', () => {
		const r = parseCgats(raw('illuminant/CIE-F10.sp'));
		expect(r.rows[0][1] * 100).toBeCloseTo(0.63, 9);
		expect(r.rows[0][45] * 100).toBeCloseTo(8.81, 9);
		expect(CIE_ILLUMINANT_TABLES.F10.values[1]).toBe(0.8);
		expect(CIE_ILLUMINANT_TABLES.F10.values[45]).toBe(8.31);
	});

	it('CIE 15:2004 Table T.1: A is 100 at 560 nm, tabulated at 1 nm from 300 nm; F-series at 5 nm from 380 nm', () => {
		const A = CIE_ILLUMINANT_TABLES.A;
		expect([A.start, A.interval, A.values.length]).toEqual([300, 1, 531]);
		expect(A.values[560 - 300]).toBe(100);
		expect([CIE_ILLUMINANT_TABLES.F2.start, CIE_ILLUMINANT_TABLES.F2.interval, CIE_ILLUMINANT_TABLES.F2.values.length]).toEqual([380, 5, 81]);
	});

	it('CIE 15:2004 Table T.2: daylight S0, S1, S2 at 560 nm are 100, 0, 0', () => {
		const i = (560 - DAYLIGHT_S0.start) / DAYLIGHT_S0.interval;
		expect([DAYLIGHT_S0.values[i], DAYLIGHT_S1.values[i], DAYLIGHT_S2.values[i]]).toEqual([100, 0, 0]);
	});

	it('colord ships 15 test colour samples; TCS15 is zero-filled outside 380–780 nm', () => {
		expect(TEST_COLOUR_SAMPLE_IDS).toEqual(Array.from({ length: 15 }, (_, i) => `TCS${String(i + 1).padStart(2, '0')}`));
		const t15 = TEST_COLOUR_SAMPLES[14];
		expect(t15.values.slice(0, 4)).toEqual([0, 0, 0, 0]);
		expect(t15.values.slice(-9)).toEqual(new Array(9).fill(0));
		expect(t15.values[(380 - 360) / 5]).toBeGreaterThan(0);
	});

	it('colord rounds the samples to 2 decimals (CIE 13.3 prints 3), TCS09 apart', () => {
		for (const [i, t] of TEST_COLOUR_SAMPLES.entries()) {
			const decimals = i === 8 ? 3 : 2;
			for (const v of t.values) expect(Math.round(v * 10 ** decimals) / 10 ** decimals).toBeCloseTo(v, 12);
		}
	});

	it.runIf(existsSync('/usr/share/colord'))('the raw copies in data/colord equal the installed Debian colord-data files', () => {
		for (const f of RAW_FILES) {
			expect(raw(f), f).toBe(readFileSync(join('/usr/share/colord', f), 'utf8'));
		}
	});
});
