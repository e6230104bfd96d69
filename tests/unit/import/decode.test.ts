import { describe, expect, it } from 'vitest';
import { assertNotBinary, ByteDecoder, decodeLatin1 } from '../../../src/lib/import/decode';
import { ImportError } from '../../../src/lib/import';
import { latin1, utf8, withBom } from './factories';

function decodeIn(bytes: Uint8Array, size: number) {
	const d = new ByteDecoder();
	let text = '';
	for (let i = 0; i < bytes.length; i += size) text += d.write(bytes.subarray(i, i + size));
	return { text: text + d.end(), encoding: d.encoding, warnings: d.warnings };
}

describe('ByteDecoder', () => {
	it('reads UTF-8, whole or a byte at a time', () => {
		const bytes = utf8('Façade, 5600 K — “cool”, λ 380–780 nm, 🎬');
		for (const size of [1, 2, 3, 1000]) {
			expect(decodeIn(bytes, size)).toEqual({ text: 'Façade, 5600 K — “cool”, λ 380–780 nm, 🎬', encoding: 'utf-8', warnings: [] });
		}
	});

	it('strips the byte order mark and says it was there', () => {
		expect(decodeIn(withBom(utf8('x,y')), 1)).toMatchObject({ text: 'x,y', encoding: 'utf-8-bom' });
		expect(decodeIn(withBom(utf8('')), 2)).toMatchObject({ text: '', encoding: 'utf-8-bom' });
	});

	it('falls back to Latin-1 for bytes that are not UTF-8 (0xE7 is ç)', () => {
		for (const size of [1, 4, 100]) {
			expect(decodeIn(latin1('label\nFaçade\n'), size)).toEqual({ text: 'label\nFaçade\n', encoding: 'latin1', warnings: [] });
		}
	});

	it('reads 0x80–0x9F as Windows-1252, as browsers do for Latin-1 (0x80 €, 0x93 “, 0x94 ”)', () => {
		expect(decodeLatin1(new Uint8Array([0x80, 0x93, 0x41, 0x94, 0x81, 0xe7, 0xff]))).toBe('€“A”\u0081çÿ');
	});

	it('treats a truncated UTF-8 sequence at the very end as Latin-1', () => {
		expect(decodeIn(new Uint8Array([0x41, 0xc3]), 1)).toMatchObject({ text: 'AÃ', encoding: 'latin1' });
	});

	it('warns when valid UTF-8 is followed by bytes that are not', () => {
		const bytes = new Uint8Array([...utf8('é\n'), 0x41, 0xe7, 0x41]);
		const r = decodeIn(bytes, 4);
		expect(r.encoding).toBe('latin1');
		expect(r.text).toBe('é\nAçA');
		expect(r.warnings[0]).toMatch(/mixes UTF-8 with other bytes/);
	});

	it('refuses NUL bytes and UTF-16', () => {
		const d = new ByteDecoder();
		expect(() => d.write(new Uint8Array([0x41, 0, 0x42]))).toThrowError(ImportError);
		const u = new ByteDecoder();
		u.write(new Uint8Array([0xfe, 0xff]));
		expect(() => u.write(new Uint8Array([0x01, 0x41]))).toThrowError(/UTF-16/);
	});
});

describe('assertNotBinary', () => {
	it('accepts text with tabs, line ends and a form feed', () => {
		expect(() => assertNotBinary('a\tb\r\nc\fd\n')).not.toThrow();
		expect(() => assertNotBinary('')).not.toThrow();
	});
	it('refuses text that is more than a tenth control characters', () => {
		expect(() => assertNotBinary('\u0001\u0002abcdefgh')).toThrowError(/control characters/);
		expect(() => assertNotBinary('\u0001abcdefghij')).not.toThrow();
	});
});
