/**
 * Geometry of the colour rendering bars: the general index Ra and the special indices R1–R15 as
 * horizontal bars from zero (negative indices extend left of the zero line), with the value of
 * each printed in its own column, Ra and R9 marked, and guide lines at rules of thumb.
 *
 * Sample names are CIE 13.3-1995's descriptions of test colour samples 1–14 (Munsell notations
 * given there) and JIS Z 8726's sample 15.
 *
 * References:
 *   CIE 13.3-1995 Method of measuring and specifying colour rendering properties of light sources,
 *     Table 1 (test colour samples 1–14), §6 (Rᵢ = 100 − 4.6 ΔEᵢ, so an index can be negative).
 *   JIS Z 8726:1990 (test colour sample 15, Japanese skin tone).
 */
import { scaleLinear, type ScaleLinear } from 'd3-scale';
import { round } from './viewport';

/** CIE 13.3-1995 Table 1 (samples 1–14) and JIS Z 8726 (sample 15). */
export const CRI_SAMPLE_NAMES: readonly string[] = [
	'light greyish red',
	'dark greyish yellow',
	'strong yellow green',
	'moderate yellowish green',
	'light bluish green',
	'light blue',
	'light violet',
	'light reddish purple',
	'strong red',
	'strong yellow',
	'strong green',
	'strong blue',
	'light yellowish pink (skin)',
	'moderate olive green (leaf)',
	'Japanese skin'
];

/**
 * Guide lines: 85 and up for anything that must render well, 90 and up better (a rule of thumb,
 * one source); R9 above 0 as a minimum for saturated reds (common practice) is the zero line.
 */
export const CRI_GUIDES: readonly number[] = [85, 90];

export interface CriBar {
	key: string;
	/** "Ra", "R1" … "R15". */
	name: string;
	/** The sample's description (empty for Ra). */
	sample: string;
	value: number;
	/** Ra and R9 are marked. */
	marked: boolean;
	/** Bar rectangle in user units. */
	x: number;
	y: number;
	width: number;
	height: number;
	/** Centre line of the row (for labels). */
	cy: number;
}

export interface CriLayout {
	width: number;
	height: number;
	/** Left edge of the bars' area, its right edge, and the x of the value column. */
	plotLeft: number;
	plotRight: number;
	valueX: number;
	zeroX: number;
	x: ScaleLinear<number, number>;
	bars: CriBar[];
	ticks: number[];
	guides: Array<{ value: number; x: number }>;
	/** Whether the sample names fit beside the index names. */
	names: boolean;
	top: number;
	bottom: number;
}

/** Lower end of the value axis: 0, or below the lowest index in steps of 20. */
export function criDomainMin(values: readonly number[]): number {
	const lo = Math.min(0, ...values.filter(Number.isFinite));
	return lo >= 0 ? 0 : Math.floor(lo / 20) * 20;
}

/**
 * Bars for Ra and R1…R15 (`r[0]` is R1) in a drawing `width` CSS pixels wide (drawn 1:1).
 * Throws RangeError for a missing or non-finite index.
 */
export function criLayout(cri: { ra: number; r: readonly number[] }, width: number, guides: readonly number[] = CRI_GUIDES): CriLayout {
	if (!cri || !Number.isFinite(cri.ra) || !Array.isArray(cri.r) || cri.r.length === 0 || !cri.r.every(Number.isFinite)) {
		throw new RangeError('colour rendering bars need a finite Ra and finite special indices');
	}
	const w = Math.max(280, Math.round(width));
	const names = w >= 520;
	const row = 24;
	const gap = 10;
	const top = 22;
	const labelWidth = names ? 230 : 40;
	const valueWidth = 44;
	const plotLeft = labelWidth;
	const plotRight = w - valueWidth - 6;
	const values = [cri.ra, ...cri.r];
	const x = scaleLinear().domain([criDomainMin(values), 100]).range([plotLeft, plotRight]);
	const zeroX = round(x(0));
	const bars: CriBar[] = values.map((value, i) => {
		const y = top + i * row + (i > 0 ? gap : 0);
		const end = x(Math.min(100, value));
		const name = i === 0 ? 'Ra' : `R${i}`;
		return {
			key: name,
			name,
			sample: i === 0 ? 'general index, mean of R1–R8' : (CRI_SAMPLE_NAMES[i - 1] ?? ''),
			value,
			marked: i === 0 || i === 9,
			x: round(Math.min(zeroX, end)),
			y: round(y + 3),
			width: round(Math.abs(end - zeroX)),
			height: row - 6,
			cy: round(y + row / 2)
		};
	});
	const bottom = top + values.length * row + gap;
	const [d0] = x.domain();
	// Ticks: the lower end (so a negative bar always has a number under it), zero, and every `step`
	// up to 100, leaving out any too close to the lower end to be read apart.
	const step = plotRight - plotLeft < 240 ? 50 : 20;
	const ticks: number[] = [d0];
	for (let v = Math.ceil(d0 / step) * step; v <= 100; v += step) if (v !== d0 && (v === 0 || v - d0 >= step * 0.6)) ticks.push(v);
	return {
		width: w,
		height: bottom + 26,
		plotLeft,
		plotRight,
		valueX: w - 4,
		zeroX,
		x,
		bars,
		ticks,
		guides: guides.filter((g) => g > d0 && g <= 100).map((value) => ({ value, x: round(x(value)) })),
		names,
		top,
		bottom
	};
}

/** An index as the bars print it: a whole number with a real minus sign. */
export function fmtIndex(v: number): string {
	if (!Number.isFinite(v)) return '–';
	const r = Math.round(v);
	return (Object.is(r, -0) ? 0 : r).toString().replace('-', '−');
}
