/** Number formats for reading tables: fixed decimals, a dash for nothing, a real minus sign. */
export function fmt(v: number | null | undefined, digits: number): string {
	if (v === null || v === undefined || !Number.isFinite(v)) return '–';
	return v.toFixed(digits).replace('-', '−');
}

export function fmtSigned(v: number | null | undefined, digits: number): string {
	if (v === null || v === undefined || !Number.isFinite(v)) return '–';
	return (v > 0 ? '+' : '') + fmt(v, digits);
}

export function fmtWhen(iso: string | null | undefined): string {
	if (!iso) return '–';
	const d = new Date(iso);
	return Number.isNaN(d.getTime()) ? '–' : d.toISOString().slice(0, 16).replace('T', ' ');
}

export const KIND_LABELS: Record<string, string> = {
	spectral: 'Spectrum',
	chromaticity_xy: 'x, y',
	chromaticity_uv_prime: "u′, v′",
	cct_duv: 'CCT + Duv',
	tristimulus: 'X, Y, Z'
};
