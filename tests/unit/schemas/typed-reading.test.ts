import { describe, expect, it } from 'vitest';
import { readNumber, toRawReading, typedReadingFormSchema } from '$lib/schemas/typed-reading';

const form = (over: Record<string, string>) => typedReadingFormSchema.parse({ label: 'Key', ...over });

describe('readNumber', () => {
	it('reads a decimal point or a decimal comma, and nothing else', () => {
		expect(readNumber('0.3127')).toBe(0.3127);
		expect(readNumber('0,3127')).toBe(0.3127);
		expect(readNumber(' -0,004 ')).toBe(-0.004);
		expect(readNumber('3 200')).toBe(3200);
		expect(readNumber('')).toBeUndefined();
		expect(readNumber('1,234,5')).toBeNaN();
		expect(readNumber('abc')).toBeNaN();
		expect(readNumber('0x10')).toBeNaN();
	});
});

describe('toRawReading', () => {
	it('turns each mode into the stored raw input', () => {
		expect(toRawReading(form({ mode: 'xy', x: '0,3127', y: '0,329' }))).toEqual({ raw: { kind: 'chromaticity_xy', x: 0.3127, y: 0.329 } });
		expect(toRawReading(form({ mode: 'uv_prime', u_prime: '0.1978', v_prime: '0.4683', lux: '850' }))).toEqual({
			raw: { kind: 'chromaticity_uv_prime', u_prime: 0.1978, v_prime: 0.4683, lux: 850 }
		});
		expect(toRawReading(form({ mode: 'cct_duv', cct_k: '3200', duv: '-0.002' }))).toEqual({ raw: { kind: 'cct_duv', cct_k: 3200, duv: -0.002 } });
	});

	it('names the field at fault, in words', () => {
		expect(toRawReading(form({ mode: 'xy', x: '', y: '0.3' }))).toEqual({ errors: { x: 'Type the x value.' } });
		expect(toRawReading(form({ mode: 'xy', x: '1.4', y: '0.3' }))).toMatchObject({ errors: { x: 'x must be below 1.' } });
		expect(toRawReading(form({ mode: 'cct_duv', cct_k: '3200', duv: 'lots' }))).toEqual({ errors: { duv: 'Duv must be a number, e.g. 0.3127.' } });
		const far = toRawReading(form({ mode: 'cct_duv', cct_k: '3200', duv: '0.09' }));
		expect('errors' in far && far.errors.duv).toMatch(/too far from the locus/);
		expect(toRawReading(form({ mode: 'xy', x: '0.6', y: '0.6' }))).toEqual({ errors: { y: 'x + y must be below 1.' } });
		expect(toRawReading(form({ mode: 'xy', x: '0.3', y: '0.3', lux: '-5' }))).toEqual({ errors: { lux: 'Lux cannot be negative.' } });
	});

	it('ignores the fields of the other modes', () => {
		expect(toRawReading(form({ mode: 'cct_duv', cct_k: '5600', duv: '0', x: 'junk' }))).toEqual({ raw: { kind: 'cct_duv', cct_k: 5600, duv: 0 } });
	});
});
