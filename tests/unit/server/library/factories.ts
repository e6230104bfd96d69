/** Small factories for library tests: CSV files of transmissions and channel spectra, built from our own models. */
import type { Spectrum } from '../../../../src/lib/colour';
import { valueAt } from '../../../../src/lib/colour';
import { gelLibrary } from '../../../../src/lib/matching/gels/library';
import { LED_GRID, ledSpectrumOhno2005, phosphorLedSpectrum } from '../../../../src/lib/matching/led/ohno2005';

export const encode = (s: string) => new TextEncoder().encode(s);

/** A long spectral CSV (`wavelength_nm,<label>…`) sampling each spectrum from start to end every step nm. */
export function longCsv(columns: Record<string, Spectrum | ((nm: number) => number)>, o: { start?: number; end?: number; step?: number; scale?: number; digits?: number } = {}): string {
	const { start = 380, end = 780, step = 5, scale = 1, digits = 6 } = o;
	const names = Object.keys(columns);
	const lines = [`wavelength_nm,${names.join(',')}`];
	for (let nm = start; nm <= end + 1e-9; nm += step) {
		const cells = names.map((n) => {
			const c = columns[n];
			const v = typeof c === 'function' ? c(nm) : valueAt(c, nm, 'hold');
			return (v * scale).toFixed(digits);
		});
		lines.push(`${nm},${cells.join(',')}`);
	}
	return lines.join('\n') + '\n';
}

/** The modelled full CTO (our library's own transmission), as a "measured" file in percent, 360–830 nm every 5 nm. */
export function modelledGelCsv(id = 'cto-full', o: { percent?: boolean; start?: number; end?: number; label?: string } = {}): string {
	const g = gelLibrary().find((x) => x.id === id);
	if (!g) throw new Error(`no gel ${id}`);
	return longCsv({ [o.label ?? 'Sample sheet']: g.transmission }, { start: o.start ?? 360, end: o.end ?? 830, step: 5, scale: o.percent === false ? 1 : 100, digits: 5 });
}

/** Channels of an invented RGBW unit: three Ohno 2005 emitters and a phosphor white, on 380–780 nm at 5 nm. */
export function rgbwChannels(): Record<string, Spectrum> {
	return {
		Red: ledSpectrumOhno2005(630, 20, LED_GRID),
		Green: ledSpectrumOhno2005(525, 35, LED_GRID),
		Blue: ledSpectrumOhno2005(455, 22, LED_GRID),
		White: phosphorLedSpectrum(
			[
				{ peak: 450, halfWidth: 22, weight: 1 },
				{ peak: 555, halfWidth: 100, weight: 0.58 },
				{ peak: 620, halfWidth: 70, weight: 0.22 }
			],
			LED_GRID
		)
	};
}

export function rgbwCsv(): string {
	return longCsv(rgbwChannels(), { digits: 6 });
}
