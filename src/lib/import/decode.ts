/**
 * Bytes to text for readings files: UTF-8 (with or without a byte order mark), falling back to
 * Latin-1 when the bytes are not valid UTF-8; refuses binary data and UTF-16.
 *
 * Latin-1 is decoded as Windows-1252, as browsers do for the "latin1" label (WHATWG Encoding
 * Standard), so bytes 0x80–0x9F give € “ ” and friends rather than invisible control codes.
 *
 * References:
 *   WHATWG Encoding Standard, §5.2 Names and labels ("latin1" is windows-1252) and
 *     index-windows-1252.txt; RFC 3629 UTF-8 (sequence lengths from the lead byte).
 *
 * Works chunk by chunk: `write()` returns the text decoded so far, holding back an incomplete
 * UTF-8 sequence at the end of a chunk until the next one arrives.
 */
import { ImportError } from './errors';
import type { Encoding } from './types';

/** How many leading characters the binary check looks at. */
export const SNIFF_CHARS = 8192;
/** Share of control characters above which text is treated as binary. */
const CONTROL_SHARE = 0.1;

/**
 * Windows-1252 code points for bytes 0x80–0x9F (WHATWG Encoding Standard, index-windows-1252; the
 * five unassigned bytes map to the same C1 code point). Written out because some runtimes' own
 * "windows-1252" decoder is plain ISO-8859-1.
 */
const CP1252_80_9F = new Uint16Array([
	0x20ac, 0x0081, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021,
	0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x008d, 0x017d, 0x008f,
	0x0090, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014,
	0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x009d, 0x017e, 0x0178
]);

export function decodeLatin1(bytes: Uint8Array): string {
	const codes = new Uint16Array(bytes.length);
	for (let i = 0; i < bytes.length; i++) {
		const b = bytes[i];
		codes[i] = b >= 0x80 && b < 0xa0 ? CP1252_80_9F[b - 0x80] : b;
	}
	let out = '';
	for (let i = 0; i < codes.length; i += 8192) out += String.fromCharCode(...codes.subarray(i, i + 8192));
	return out;
}

/** Length of a complete UTF-8 prefix: an unfinished multi-byte sequence at the end is left out. */
function completeUtf8Length(bytes: Uint8Array): number {
	const n = bytes.length;
	for (let back = 1; back <= Math.min(4, n); back++) {
		const b = bytes[n - back];
		if ((b & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead
		const need = b >= 0xf0 && b <= 0xf7 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
		return need > back ? n - back : n;
	}
	return n;
}

function isControl(code: number): boolean {
	return (code < 0x20 && code !== 0x09 && code !== 0x0a && code !== 0x0d && code !== 0x0c) ||
		(code >= 0x7f && code <= 0x9f);
}

/** Throws `binary` when the sample contains NUL or is mostly control characters. */
export function assertNotBinary(sample: string): void {
	if (sample.includes('\u0000')) {
		throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it contains NUL bytes).');
	}
	const n = Math.min(sample.length, SNIFF_CHARS);
	let controls = 0;
	for (let i = 0; i < n; i++) if (isControl(sample.charCodeAt(i))) controls++;
	if (n > 0 && controls / n > CONTROL_SHARE) {
		throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it is mostly control characters).');
	}
}

export class ByteDecoder {
	encoding: Exclude<Encoding, 'text'> = 'utf-8';
	readonly warnings: string[] = [];
	private head: Uint8Array | null = new Uint8Array(0);
	private pending: Uint8Array = new Uint8Array(0);
	private mode: 'utf8' | 'latin1' = 'utf8';
	private sawNonAscii = false;
	private readonly utf8 = new TextDecoder('utf-8', { fatal: true });

	/** Decodes one chunk; returns the text that is complete so far (possibly empty). */
	write(chunk: Uint8Array): string {
		if (chunk.includes(0)) {
			throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it contains NUL bytes).');
		}
		if (this.head) {
			// Hold the first bytes until the byte order mark (if any) can be seen whole.
			this.head = concat(this.head, chunk);
			if (this.head.length < 4) return '';
			chunk = this.takeHead();
		}
		return this.decode(chunk, false);
	}

	end(): string {
		const chunk = this.head ? this.takeHead() : new Uint8Array(0);
		return this.decode(chunk, true);
	}

	private takeHead(): Uint8Array {
		let b = this.head!;
		this.head = null;
		if (b.length >= 2 && ((b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff))) {
			throw new ImportError('unrecognised', 'The file is saved as UTF-16 text; save it as UTF-8 CSV and try again.');
		}
		if (b.length >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) {
			this.encoding = 'utf-8-bom';
			b = b.subarray(3);
		}
		return b;
	}

	private decode(chunk: Uint8Array, final: boolean): string {
		if (this.mode === 'latin1') return decodeLatin1(chunk);
		const bytes = this.pending.length ? concat(this.pending, chunk) : chunk;
		const cut = final ? bytes.length : completeUtf8Length(bytes);
		this.pending = bytes.slice(cut);
		const complete = bytes.subarray(0, cut);
		try {
			const text = this.utf8.decode(complete);
			if (text.length !== complete.length) this.sawNonAscii = true;
			return text;
		} catch {
			if (this.sawNonAscii) {
				this.warnings.push(
					'The file mixes UTF-8 with other bytes; the part from the first invalid byte on was read as Latin-1.'
				);
			}
			this.mode = 'latin1';
			this.encoding = 'latin1';
			const rest = concat(complete, this.pending);
			this.pending = new Uint8Array(0);
			return decodeLatin1(rest);
		}
	}
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
	if (a.length === 0) return b;
	if (b.length === 0) return a;
	const out = new Uint8Array(a.length + b.length);
	out.set(a, 0);
	out.set(b, a.length);
	return out;
}
