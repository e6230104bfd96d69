/**
 * Number formats for the library pages: signed mired, Duv to 4 decimals, stops to 0.1, ranges.
 * Display only; the typographic minus sign is used for negatives.
 */
import type { ValueRange } from '$lib/matching';

const minus = (s: string) => s.replace(/^-/, '−');

/** Signed with a plus for positive values; `digits` decimals. */
export function signed(n: number, digits = 0): string {
	if (!Number.isFinite(n)) return '–';
	const r = Number(n.toFixed(digits));
	if (r === 0) return (0).toFixed(digits);
	return (r > 0 ? '+' : '') + minus(r.toFixed(digits));
}

/** Mired: whole numbers, one decimal below 10 (⅛ filters are a few mired). */
export function fmtMired(n: number): string {
	return signed(n, Math.abs(n) < 10 ? 1 : 0);
}

/** A figure as the model uses it (e.g. −65.5, +159), to at most one decimal, without trailing zeros. */
export function fmtExact(n: number): string {
	if (!Number.isFinite(n)) return '–';
	const s = String(Number(n.toFixed(1)));
	return n > 0 ? `+${s}` : minus(s);
}

/** A quoted range's end: whole mired (one decimal below 10), since quoted figures differ by several mired. */
export function fmtRangeEnd(n: number): string {
	return fmtMired(n);
}

export function fmtDuv(n: number): string {
	return signed(n, 4);
}

/** Stops to 0.1: light loss figures are rules of thumb, and a tenth of a stop is below what a meter reading on set settles. */
export function fmtStops(n: number): string {
	if (!Number.isFinite(n)) return '–';
	const s = n.toFixed(1);
	return `${s} ${Number(s) === 1 ? 'stop' : 'stops'}`;
}

export function fmtRange(r: ValueRange, f: (n: number) => string): string {
	return `${f(r.min)} to ${f(r.max)}`;
}

export function fmtNm(n: number): string {
	return `${Number(n.toFixed(1))} nm`;
}

export function fmtPercent(share: number): string {
	return `${Math.round(share * 100)} %`;
}

export function fmtDate(iso: string | null): string {
	if (!iso) return '';
	return new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
}

/** An SVG path through values on a 380–780 nm axis, in a w × h box with 0..top on the y axis. */
export function curvePath(values: number[], start: number, interval: number, w: number, h: number, top = 1): string {
	const x = (nm: number) => ((nm - 380) / 400) * w;
	const y = (v: number) => h - (Math.max(0, Math.min(top, v)) / top) * h;
	return values.map((v, i) => `${i === 0 ? 'M' : 'L'}${x(start + i * interval).toFixed(1)},${y(v).toFixed(1)}`).join('');
}

/** Transmission at a wavelength from a sampled curve (nearest sample). */
export function curveAt(values: number[], start: number, interval: number, nm: number): number {
	const i = Math.round((nm - start) / interval);
	return values[Math.max(0, Math.min(values.length - 1, i))] ?? Number.NaN;
}

export const FAMILY_TITLES: Record<string, { title: string; blurb: string }> = {
	CTO: {
		title: 'Warming: CTO',
		blurb: 'Colour temperature orange. Full CTO ≈ +159 mired, 6500 K to about 3200 K (common practice); fractions in proportion. Quoted figures differ by up to about 15 mired, so the range is shown.'
	},
	CTB: {
		title: 'Cooling: CTB',
		blurb: 'Colour temperature blue. Full CTB ≈ −131 mired, 3200 K to about 5500 K (common practice); the light loss is quoted anywhere from 1 to 2 stops.'
	},
	'plus-green': {
		title: 'Plus green',
		blurb: 'Our own absorption-band design, with a full strength at a peak density of 0.30 (≈ CC 30, common practice). Duv, side effect on mired and loss are derived from the model.'
	},
	'minus-green': {
		title: 'Minus green',
		blurb: 'Our own band design in the green, calibrated the same way. Its mired side effect is larger than crews usually describe for real sheets.'
	},
	ND: { title: 'Neutral density', blurb: 'Cuts light without moving colour: density × log₂10 stops (0.3 ≈ 1 stop).' }
};
