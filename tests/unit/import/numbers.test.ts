import { describe, expect, it } from 'vitest';
import { fmt, numberCellMessage, parseNumberCell, plainNumber } from '../../../src/lib/import/numbers';

describe('parseNumberCell', () => {
	it.each([
		['0.31272', 0.31272],
		[' 42 ', 42],
		['-0.5', -0.5],
		['+3', 3],
		['.5', 0.5],
		['5.', 5],
		['1e-3', 0.001],
		['6.5E3', 6500]
	])('reads %j as %d', (text, value) => {
		expect(parseNumberCell(text, false)).toEqual({ ok: true, value, decimalComma: false });
	});

	it('reads decimal commas only when allowed', () => {
		expect(parseNumberCell('0,4476', true)).toEqual({ ok: true, value: 0.4476, decimalComma: true });
		expect(parseNumberCell('0,4476', false)).toMatchObject({ ok: false, reason: 'decimal_comma' });
		expect(parseNumberCell('0.4476', true)).toEqual({ ok: true, value: 0.4476, decimalComma: false });
	});

	it.each([
		['', 'empty'],
		['   ', 'empty'],
		[undefined, 'empty'],
		['NaN', 'not_a_number'],
		['12 lux', 'not_a_number'],
		['0x10', 'not_a_number'],
		['1.234,5', 'not_a_number'],
		['1e999', 'not_finite'],
		['-Infinity', 'not_finite']
	])('refuses %j (%s)', (text, reason) => {
		expect(parseNumberCell(text, true)).toMatchObject({ ok: false, reason });
	});

	it('words its messages', () => {
		const m = (t: string) => {
			const c = parseNumberCell(t, false);
			if (c.ok) throw new Error('expected a refusal');
			return numberCellMessage(7, 'x', c);
		};
		expect(m('')).toBe('row 7: x is empty');
		expect(m('n/a')).toBe('row 7: x = n/a is not a number (no value)');
		expect(m('warm')).toBe('row 7: x = "warm" is not a number');
		expect(m('x'.repeat(60))).toBe(`row 7: x = "${'x'.repeat(37)}…" is not a number`);
	});

	it('formats numbers briefly', () => {
		expect(fmt(1.2000000000000002)).toBe('1.2');
		expect(fmt(1e12)).toBe('1e+12');
		expect(fmt(0)).toBe('0');
	});
});

describe('plainNumber', () => {
	it('agrees with parseNumberCell wherever it returns a number', () => {
		const cases = ['0.31272', ' 42 ', '\t-0.5', '+3', '.5', '5.', '1e-3', '6.5E3', '', ' ', '.', '-', 'e5', '1e', '1e+', '0x10', '1,5', 'NaN', '1e999', '12 lux', '\u00a01', '1.2.3', '--1', '  0x1f', '0b1', '0o7', '-0x10', 'Infinity', '+Infinity', ' \t ', '1\u00a0', '\n2', '1_000', '0.0', '-0'];
		for (const c of cases) {
			const slow = parseNumberCell(c, false);
			const fast = plainNumber(c);
			if (Number.isNaN(fast)) continue;
			expect(slow).toEqual({ ok: true, value: fast, decimalComma: false });
		}
		expect(plainNumber('0.31272')).toBe(0.31272);
		expect(plainNumber(' 42 ')).toBe(42);
		expect(plainNumber('1e999')).toBeNaN();
		expect(plainNumber('0x10')).toBeNaN();
		expect(plainNumber('  0b1')).toBeNaN();
		expect(plainNumber(' \t ')).toBeNaN();
		expect(plainNumber('0.0')).toBe(0);
		expect(plainNumber(undefined)).toBeNaN();
	});
});
