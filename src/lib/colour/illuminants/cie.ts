/**
 * CIE standard and reference illuminants by name.
 *
 * A, C and F1–F12 come from the tables in data/ (colord-data, scaled back to CIE 15:2004's printed
 * scale; F10 corrected at 385 and 605 nm, see data/README.md). A is tabulated at 1 nm from 300 nm;
 * it is returned at 5 nm (every fifth value, 300–830 nm, as CIE 15:2004 Table T.1 prints it) unless
 * 1 nm is asked for. C and F1–F12 are at 5 nm, 380–780 nm. D50, D55, D65 and D75 are built from
 * S0, S1, S2 (daylight.ts) at 5000, 5500, 6500, 7500 K × 1.4388/1.4380, 300–830 nm at 5 nm.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., Tables T.1 (A, D65), T.2 (S0, S1, S2), T.6 (F1–F12),
 *     §3.1–3.2; CIE 15.2-1986 for C.
 */
import { CIE_ILLUMINANT_TABLES } from '../data/illuminants';
import type { Spectrum } from '../spectrum';
import { daylightSpectrumUnchecked } from './daylight';

export type CieIlluminantName =
	| 'A'
	| 'C'
	| 'D50'
	| 'D55'
	| 'D65'
	| 'D75'
	| 'F1'
	| 'F2'
	| 'F3'
	| 'F4'
	| 'F5'
	| 'F6'
	| 'F7'
	| 'F8'
	| 'F9'
	| 'F10'
	| 'F11'
	| 'F12';

export const CIE_ILLUMINANT_NAMES: readonly CieIlluminantName[] = [
	'A', 'C', 'D50', 'D55', 'D65', 'D75', 'F1', 'F2', 'F3', 'F4', 'F5', 'F6', 'F7', 'F8', 'F9', 'F10', 'F11', 'F12'
];

/** Nominal temperature correction of the D series for c2 = 1.4388e-2 instead of 1.4380e-2 m·K. */
export const D_SERIES_C2_RATIO = 1.4388 / 1.438;

const D_NOMINAL: Record<string, number> = { D50: 5000, D55: 5500, D65: 6500, D75: 7500 };

/**
 * A CIE illuminant's relative spectral power (CIE 15:2004 scale). For A, options.interval 1 gives
 * the 1 nm table (300–830 nm); the default is 5 nm.
 */
export function cieIlluminant(name: CieIlluminantName, options: { interval?: 1 | 5 } = {}): Spectrum {
	if (name in D_NOMINAL) {
		return daylightSpectrumUnchecked(D_NOMINAL[name] * D_SERIES_C2_RATIO, 300, 830, 5);
	}
	const table = (CIE_ILLUMINANT_TABLES as Record<string, { start: number; interval: number; values: readonly number[] }>)[name];
	if (!table || name === 'D50' || name === 'D65') {
		throw new RangeError(`unknown CIE illuminant ${String(name)}: use one of ${CIE_ILLUMINANT_NAMES.join(', ')}`);
	}
	if (name === 'A' && (options.interval ?? 5) === 5) {
		// Select 300, 305, … 830 nm from the 1 nm table explicitly.
		const values: number[] = [];
		for (let nm = 300; nm <= 830; nm += 5) values.push(table.values[(nm - table.start) / table.interval]);
		return { start: 300, interval: 5, values: Float64Array.from(values), scale: 'relative' };
	}
	return { start: table.start, interval: table.interval, values: Float64Array.from(table.values), scale: 'relative' };
}

/** colord-data's own D50 and D65 tables (CIE 15:2004 scale), kept only for comparison. */
export function colordDaylightTable(name: 'D50' | 'D65'): Spectrum {
	const t = CIE_ILLUMINANT_TABLES[name];
	return { start: t.start, interval: t.interval, values: Float64Array.from(t.values), scale: 'relative' };
}
