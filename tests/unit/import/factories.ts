/**
 * Small builders for importer test files. The spectra here are invented smooth shapes for parser
 * tests only; colour-science checks use the colour core's published illuminants instead.
 */
export const utf8 = (s: string): Uint8Array => new TextEncoder().encode(s);

/** Latin-1 bytes for a string whose characters are all below U+0100. */
export function latin1(s: string): Uint8Array {
	const out = new Uint8Array(s.length);
	for (let i = 0; i < s.length; i++) {
		const c = s.charCodeAt(i);
		if (c > 0xff) throw new Error(`not Latin-1: ${s[i]}`);
		out[i] = c;
	}
	return out;
}

export function withBom(bytes: Uint8Array): Uint8Array {
	const out = new Uint8Array(bytes.length + 3);
	out.set([0xef, 0xbb, 0xbf], 0);
	out.set(bytes, 3);
	return out;
}

/** Lines joined with \n (or `eol`), cells with the delimiter; no quoting (callers quote if needed). */
export function csv(rows: (string | number)[][], delimiter = ',', eol = '\n'): string {
	return rows.map((r) => r.join(delimiter)).join(eol) + eol;
}

export function wavelengths(start = 380, end = 780, step = 5): number[] {
	const out: number[] = [];
	for (let nm = start; nm <= end + 1e-9; nm += step) out.push(Number(nm.toFixed(6)));
	return out;
}

/** An invented smooth positive shape, rising to the red (tungsten-like in spirit only). */
export function warmShape(nm: number): number {
	return Number((20 + 80 * ((nm - 380) / 400) ** 1.5).toFixed(4));
}

/** A wide spectral file: one header of wavelengths (with optional extra columns first), rows of values. */
export function wideFile(options: {
	nm?: number[];
	headerOf?: (nm: number) => string;
	extra?: string[];
	rows?: { extra?: (string | number)[]; values?: (string | number)[] }[];
	delimiter?: string;
}): string {
	const nm = options.nm ?? wavelengths();
	const header = [...(options.extra ?? []), ...nm.map(options.headerOf ?? String)];
	const rows = (options.rows ?? [{}]).map((r) => [...(r.extra ?? []), ...(r.values ?? nm.map(warmShape))]);
	return csv([header, ...rows], options.delimiter ?? ',');
}

/** A long spectral file: wavelength column then one column per reading. */
export function longFile(labels: string[], nm = wavelengths(), value: (nm: number, j: number) => string | number = (n, j) => warmShape(n) * (j + 1)): string {
	return csv([['wavelength_nm', ...labels], ...nm.map((n) => [n, ...labels.map((_, j) => value(n, j))])]);
}

/** Splits bytes into chunks of the given sizes (cycled), for streaming tests. */
export function chunks(bytes: Uint8Array, sizes: number[]): Uint8Array[] {
	const out: Uint8Array[] = [];
	let i = 0;
	let k = 0;
	while (i < bytes.length) {
		const n = Math.max(1, sizes[k++ % sizes.length]);
		out.push(bytes.subarray(i, i + n));
		i += n;
	}
	return out;
}
