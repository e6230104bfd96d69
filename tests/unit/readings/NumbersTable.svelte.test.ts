import { render, screen, within } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { analyzeChromaticity, analyzeSpectrum, cieIlluminant } from '$lib/colour';
import NumbersTable from '$lib/components/readings/NumbersTable.svelte';

const cell = (key: string, i = 0) => screen.getAllByTestId(`numbers-table-${key}`)[i];

describe('NumbersTable', () => {
	it('CIE 15:2004 Table T.3: illuminant A shows 2856 K, x 0.4476, y 0.4074–0.4075, and its CRI (published values; A is its own reference, so Ra 100)', () => {
		const a = analyzeSpectrum(cieIlluminant('A'));
		render(NumbersTable, { columns: [{ id: 1, label: 'Illuminant A', spectral: true, analysis: a }] });
		expect(cell('cct')).toHaveTextContent('2856 K');
		expect(cell('xy').textContent).toMatch(/^0\.4476, 0\.407[45]$/);
		expect(cell('mired')).toHaveTextContent((1e6 / a.cct_k!).toFixed(1));
		expect(cell('ra')).toHaveTextContent('100.0');
		expect(cell('r9')).toHaveTextContent(a.cri!.r[8].toFixed(1));
		// A relative spectrum carries no illuminance.
		expect(cell('lux')).toHaveTextContent('relative spectrum');
		expect(cell('warnings')).toHaveTextContent('None');
	});

	it('Duv is signed and says which side of the Planckian locus (above 0: green, Ohno 2014)', () => {
		const green = analyzeChromaticity({ cct_k: 4000, duv: 0.006 });
		const magenta = analyzeChromaticity({ cct_k: 4000, duv: -0.006 }, 850);
		render(NumbersTable, { columns: [{ id: 'g', label: 'Greenish', spectral: false, analysis: green }, { id: 'm', label: 'Magenta', spectral: false, analysis: magenta }] });
		expect(cell('duv', 0)).toHaveTextContent('+0.0060 (green side)');
		expect(cell('duv', 1)).toHaveTextContent('−0.0060 (magenta side)');
		expect(cell('lux', 1)).toHaveTextContent('850 lx');
		// Two readings: one column each, with their names as headers.
		expect(screen.getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['Greenish', 'Magenta']);
	});

	it('a chromaticity reading says CRI and SSI need a spectrum rather than leaving blanks', () => {
		render(NumbersTable, { columns: [{ id: 1, label: 'Typed', spectral: false, analysis: analyzeChromaticity({ x: 0.3457, y: 0.3585 }) }] });
		for (const k of ['ra', 'r9', 'ssi']) expect(cell(k)).toHaveTextContent('needs a spectrum');
	});

	it('lists every warning of a reading', () => {
		const far = analyzeChromaticity({ x: 0.2, y: 0.6 });
		render(NumbersTable, { columns: [{ id: 1, label: 'Green', spectral: false, analysis: far }] });
		expect(far.warnings.length).toBeGreaterThan(0);
		expect(within(cell('warnings')).getAllByRole('listitem')).toHaveLength(far.warnings.length);
		// Ohno 2014 CCT is computed but marked as not meaningful so far from the locus (|Duv| > 0.05).
		expect(cell('cct')).toHaveTextContent(/K \(not meaningful: Duv beyond ±0\.05\)$/);
	});
});
