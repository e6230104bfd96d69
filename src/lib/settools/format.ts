/**
 * Number formatting for the set tools: shutter angles, exposure times, beat periods, watts and amps.
 * One fixed locale (en-GB grouping: 1,920 W) so the server and the browser print the same text.
 * A no-break space (U+00A0) joins each number to its unit so "80 W" never breaks across lines.
 */

/** No-break space between a number and its unit. */
export const NBSP = '\u00a0';

const grouped = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });
const oneDecimal = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

/** Up to `digits` decimals, trailing zeros dropped: 172.8, 71.93, 144. */
export function trimmed(x: number, digits = 2): string {
	if (!Number.isFinite(x)) return '–';
	const s = x.toFixed(digits);
	return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/** A shutter angle in degrees: "172.8°". */
export function formatAngle(angleDeg: number): string {
	return `${trimmed(angleDeg, 2)}°`;
}

/** An exposure time as cameras show it: "1/100 s", "1/33.3 s", "1.2 s". */
export function formatExposure(seconds: number): string {
	if (!Number.isFinite(seconds) || seconds <= 0) return '–';
	if (seconds >= 1) return `${trimmed(seconds, 2)}${NBSP}s`;
	const d = 1 / seconds;
	return Math.abs(d - Math.round(d)) < 0.005 ? `1/${Math.round(d)}${NBSP}s` : `1/${trimmed(d, 1)}${NBSP}s`;
}

/** A frequency: "0.12 Hz", "4 Hz". */
export function formatHz(hz: number): string {
	if (!Number.isFinite(hz)) return '–';
	return `${hz >= 10 ? trimmed(hz, 1) : trimmed(hz, 2)}${NBSP}Hz`;
}

/** Seconds for a beat period: "8.3 s", "0.25 s", "42 s". */
export function formatSeconds(seconds: number): string {
	if (!Number.isFinite(seconds)) return '–';
	if (seconds >= 100) return `${grouped.format(seconds)}${NBSP}s`;
	return `${seconds >= 1 ? trimmed(seconds, 1) : trimmed(seconds, 2)}${NBSP}s`;
}

/** Watts with grouping: "1,920 W". */
export function formatWatts(watts: number): string {
	return Number.isFinite(watts) ? `${grouped.format(watts)}${NBSP}W` : `–${NBSP}W`;
}

/** Amps to one decimal: "16 A", "8.3 A". */
export function formatAmps(amps: number): string {
	return Number.isFinite(amps) ? `${oneDecimal.format(amps)}${NBSP}A` : `–${NBSP}A`;
}

/** A fraction as a whole percentage: 0.8 → "80 %". */
export function formatPercent(fraction: number): string {
	return Number.isFinite(fraction) ? `${grouped.format(fraction * 100)}${NBSP}%` : `–${NBSP}%`;
}

/**
 * A number typed into a text field: spaces ignored, a decimal comma accepted ("23,976"), thousands
 * separators not. Blank or unreadable text gives NaN, which the validators turn into a message.
 */
export function parseDecimal(text: string | null | undefined): number {
	if (text == null) return NaN;
	const s = String(text).trim().replace(/\s+/g, '').replace(',', '.');
	if (s === '' || !/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s)) return NaN;
	return Number(s);
}

/** The text a field shows for a number: blank for NaN, otherwise up to 6 decimals, trimmed. */
export function numberText(x: number): string {
	return Number.isFinite(x) ? trimmed(x, 6) : '';
}
