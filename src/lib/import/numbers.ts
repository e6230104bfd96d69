/**
 * Reading numbers out of CSV cells. Strict on purpose: `12 lux`, `1,234` (in a comma file),
 * `0x10` or `NaN` are refused with a reason rather than half-read.
 */

const DOT_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const NOT_A_NUMBER = /^(?:nan|n\/a|na|-|--|null|none|#n\/a|#value!|#div\/0!)$/i;

export type NumberCell =
	| { ok: true; value: number; decimalComma: boolean }
	| { ok: false; reason: 'empty' | 'not_a_number' | 'not_finite' | 'decimal_comma'; text: string };

/**
 * The common case without allocating: a plain dot-decimal number, optionally padded with spaces or
 * tabs. Returns NaN for anything else (empty, decimal comma, words, infinite), for which
 * `parseNumberCell` gives the reason. Same acceptance as `parseNumberCell` where it returns a number.
 */
export function plainNumber(raw: string | undefined): number {
	if (raw === undefined) return NaN;
	// Let the engine parse, then rule out what Number() takes but a cell must not mean:
	// blank (→ 0), 0x/0b/0o prefixes, Infinity, and anything starting oddly (left to the slow path).
	const c0 = raw.charCodeAt(0);
	if (!((c0 >= 48 && c0 <= 57) || c0 === 45 || c0 === 43 || c0 === 46 || c0 === 32 || c0 === 9)) return NaN;
	const v = +raw;
	if (v - v !== 0) return NaN; // NaN or ±Infinity
	if (v === 0 && raw.trim() === '') return NaN;
	let i = 0;
	while (raw.charCodeAt(i) === 32 || raw.charCodeAt(i) === 9) i++;
	if (raw.charCodeAt(i) === 48) {
		const c = raw.charCodeAt(i + 1) | 32;
		if (c === 120 || c === 98 || c === 111) return NaN;
	}
	return v;
}

/**
 * Reads one cell. `allowDecimalComma` is true only in `;`-delimited files, where `0,4476` means
 * 0.4476 (a dot is still accepted there too).
 */
export function parseNumberCell(raw: string | undefined, allowDecimalComma: boolean): NumberCell {
	const text = (raw ?? '').trim();
	if (text === '') return { ok: false, reason: 'empty', text };
	if (DOT_NUMBER.test(text)) {
		const value = Number(text);
		return Number.isFinite(value)
			? { ok: true, value, decimalComma: false }
			: { ok: false, reason: 'not_finite', text };
	}
	if (COMMA_NUMBER.test(text)) {
		if (!allowDecimalComma) return { ok: false, reason: 'decimal_comma', text };
		const value = Number(text.replace(',', '.'));
		return Number.isFinite(value)
			? { ok: true, value, decimalComma: true }
			: { ok: false, reason: 'not_finite', text };
	}
	if (/^[+-]?inf(inity)?$/i.test(text)) return { ok: false, reason: 'not_finite', text };
	return { ok: false, reason: 'not_a_number', text };
}

/** Keeps messages short when a cell holds a long string. */
export function quoteCell(text: string): string {
	const t = text.length > 40 ? `${text.slice(0, 37)}…` : text;
	return JSON.stringify(t);
}

/** `row 7: x = 1.4 is outside 0–1` and friends, for a cell that is not a usable number. */
export function numberCellMessage(row: number, column: string, cell: Exclude<NumberCell, { ok: true }>): string {
	switch (cell.reason) {
		case 'empty':
			return `row ${row}: ${column} is empty`;
		case 'not_finite':
			return `row ${row}: ${column} = ${cell.text} is not a finite number`;
		case 'decimal_comma':
			return `row ${row}: ${column} = ${cell.text} uses a decimal comma, which is read only in semicolon-separated files`;
		default:
			return NOT_A_NUMBER.test(cell.text)
				? `row ${row}: ${column} = ${cell.text} is not a number (no value)`
				: `row ${row}: ${column} = ${quoteCell(cell.text)} is not a number`;
	}
}

/** Short display of a number in messages: 1.4, 0.0031, 1e+12. */
export function fmt(v: number): string {
	if (v === 0) return '0';
	const a = Math.abs(v);
	if (a >= 1e6 || a < 1e-4) return v.toExponential(3).replace(/\.?0+e/, 'e');
	return String(Number(v.toPrecision(6)));
}
