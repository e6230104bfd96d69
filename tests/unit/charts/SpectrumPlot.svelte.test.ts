import { fireEvent, render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { cieIlluminant, planckianSpectrum } from '$lib/colour';
import SpectrumPlot from '$lib/components/charts/SpectrumPlot.svelte';
import type { PlotSeries } from '$lib/charts/spectrum';

const plain = (s: { start: number; interval: number; values: Float64Array; scale: 'relative' | 'absolute' }) => ({ ...s, values: Array.from(s.values) });
const A: PlotSeries = { id: 'a', label: 'Illuminant A', role: 'reading', spectrum: plain(cieIlluminant('A')) };
const D65: PlotSeries = { id: 'd65', label: 'Illuminant D65', role: 'reference', spectrum: plain(cieIlluminant('D65')) };

/** The vertices of a path "Mx,yLx,y…". */
function vertices(d: string): Array<[number, number]> {
	return [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}
const lineOf = (id: string) => screen.getAllByTestId('spectrum-plot-line').find((g) => g.getAttribute('data-id') === id)!;
const pathOf = (id: string) => vertices(lineOf(id).querySelector('path')!.getAttribute('d')!);
/** The y of the tick whose label is `label` (the label sits 4 units below its line). */
function tickY(testid: string, label: string): number {
	const t = screen.getAllByTestId(testid).find((e) => e.textContent === label);
	if (!t) throw new Error(`no tick ${label}: ${screen.getAllByTestId(testid).map((e) => e.textContent).join(', ')}`);
	return Number(t.getAttribute('y')) - 4;
}
// The plot is drawn 640 units wide until it is measured (jsdom measures 0): x = 54 + (nm − 380) / 400 × 572.
const xAt = (nm: number) => Math.round((54 + ((nm - 380) / 400) * 572) * 100) / 100;

describe('SpectrumPlot', () => {
	it('CIE 15:2004 Table T.1: on the “100 at 560 nm” scale, A’s point at 560 nm sits on the 100 line', () => {
		render(SpectrumPlot, { title: 'A', series: [A], scale: 'at560' });
		const v = pathOf('a').find(([x]) => Math.abs(x - xAt(560)) < 0.01)!;
		expect(v).toBeDefined();
		expect(v[1]).toBeCloseTo(tickY('spectrum-plot-ytick', '100'), 1);
		expect(screen.getByTestId('spectrum-plot-axes')).toHaveTextContent('100 at 560 nm');
	});

	it('CIE 15:2004 Table T.1: normalised to its peak, A tops out at 780 nm (241.675) on the 1 line, and 560 nm sits at 100/241.675 of it', () => {
		render(SpectrumPlot, { title: 'A', series: [A], scale: 'peak' });
		const pts = pathOf('a');
		const top = pts.reduce((m, p) => (p[1] < m[1] ? p : m));
		expect(top[0]).toBeCloseTo(xAt(780), 1);
		const one = tickY('spectrum-plot-ytick', '1');
		const zero = tickY('spectrum-plot-ytick', '0');
		expect(top[1]).toBeCloseTo(one, 1);
		const at560 = pts.find(([x]) => Math.abs(x - xAt(560)) < 0.01)!;
		expect((zero - at560[1]) / (zero - one)).toBeCloseTo(100 / 241.675, 3);
	});

	it('CIE 15:2004 Table T.1: D65 normalised to its peak has its top at 460 nm', () => {
		render(SpectrumPlot, { title: 'D65', series: [D65], scale: 'peak' });
		const top = pathOf('d65').reduce((m, p) => (p[1] < m[1] ? p : m));
		expect(top[0]).toBeCloseTo(xAt(460), 1);
	});

	it('lines differ by dash and marker shape as well as colour, and the key names each', () => {
		render(SpectrumPlot, { title: 'two', series: [A, D65] });
		const [a, d] = [lineOf('a'), lineOf('d65')];
		expect(a.querySelector('path')!.getAttribute('stroke-dasharray')).toBeNull();
		expect(d.querySelector('path')!.getAttribute('stroke-dasharray')).toBeTruthy();
		const markerOf = (g: Element) => g.querySelectorAll('path')[1].getAttribute('d');
		expect(markerOf(a)).not.toBe(markerOf(d));
		const key = screen.getByTestId('spectrum-plot-key');
		expect(key).toHaveTextContent('Illuminant A');
		expect(key).toHaveTextContent('Illuminant D65');
	});

	it('absolute readings offer the W/m²/nm scale; relative lines are matched to them and say so', async () => {
		const abs = planckianSpectrum(3200, 380, 780, 5);
		const m: PlotSeries = { id: 'm', label: 'Measured', role: 'reading', spectrum: { ...plain(abs), scale: 'absolute', values: Array.from(abs.values, (v) => v * 0.002) } };
		render(SpectrumPlot, { title: 'abs', series: [m, D65], scale: 'peak' });
		expect(screen.getByTestId('spectrum-plot')).toHaveAttribute('data-scale', 'peak');
		await fireEvent.change(screen.getByTestId('spectrum-plot-scale'), { target: { value: 'absolute' } });
		expect(screen.getByTestId('spectrum-plot')).toHaveAttribute('data-scale', 'absolute');
		expect(screen.getByTestId('spectrum-plot-axes')).toHaveTextContent('W/m²/nm');
		expect(screen.getByTestId('spectrum-plot-key')).toHaveTextContent('scaled to the illuminance of Measured');
		// 3200 K Planckian × 0.002 is 0.2 W/m²/nm at 560 nm (CIE 15:2004 §3.1 normalisation: 100 at 560 nm).
		const v = pathOf('m').find(([x]) => Math.abs(x - xAt(560)) < 0.01)!;
		const zero = tickY('spectrum-plot-ytick', '0');
		const ticks = screen.getAllByTestId('spectrum-plot-ytick').map((t) => [Number(t.textContent), Number(t.getAttribute('y')) - 4] as const);
		const [t1, y1] = ticks[ticks.length - 1];
		expect(((zero - v[1]) / (zero - y1)) * t1).toBeCloseTo(0.2, 2);
	});

	it('without an absolute reading there is no absolute scale to pick', () => {
		render(SpectrumPlot, { title: 'rel', series: [A] });
		const options = [...(screen.getByTestId('spectrum-plot-scale') as HTMLSelectElement).options].map((o) => o.value);
		expect(options).toEqual(['peak', 'luminance', 'at560']);
	});

	it('transmissions go on a second axis, 0–100 %: 50 % at 550 nm sits on the 50 % line', () => {
		const tau = { start: 380, interval: 10, values: Array.from({ length: 41 }, (_, i) => (380 + i * 10 === 550 ? 0.5 : 0.8)) };
		render(SpectrumPlot, { title: 't', series: [A], transmissions: [{ id: 'g', label: '½ CTB', transmission: tau }] });
		const ticks = screen.getAllByTestId('spectrum-plot-ttick').map((t) => t.textContent);
		expect(ticks).toEqual(['0 %', '25 %', '50 %', '75 %', '100 %']);
		const g = screen.getByTestId('spectrum-plot-transmission');
		// 640 units with the right axis: right margin 46, so x = 54 + (nm − 380) / 400 × 540.
		const at = vertices(g.querySelector('path')!.getAttribute('d')!).find(([x]) => Math.abs(x - (54 + (170 / 400) * 540)) < 0.01)!;
		expect(at[1]).toBeCloseTo(tickY('spectrum-plot-ttick', '50 %'), 1);
		expect(screen.getByTestId('spectrum-plot-key')).toHaveTextContent('½ CTB (transmission, right axis)');
	});

	it('keyboard: the cursor moves with the arrow keys and reads every line out', async () => {
		const user = userEvent.setup();
		render(SpectrumPlot, { title: 'kb', series: [A, D65], scale: 'at560' });
		const slider = screen.getByRole('slider');
		// Reachable by Tab alone (after the scale and the table button).
		for (let i = 0; i < 8 && document.activeElement !== slider; i++) await user.tab();
		expect(slider).toHaveFocus();
		await user.keyboard('{Home}');
		expect(slider).toHaveAttribute('aria-valuenow', '380');
		await user.keyboard('{ArrowRight}{ArrowRight}');
		expect(slider).toHaveAttribute('aria-valuenow', '390');
		await user.keyboard('{End}{ArrowLeft}');
		expect(slider).toHaveAttribute('aria-valuenow', '775');
		// 560 nm: both are 100 there on this scale (CIE 15:2004 Table T.1).
		await user.keyboard('{Home}{PageUp}{PageUp}{PageUp}{ArrowRight}{ArrowRight}{ArrowRight}{ArrowRight}{ArrowRight}{ArrowRight}');
		expect(slider).toHaveAttribute('aria-valuenow', '560');
		expect(slider.getAttribute('aria-valuetext')).toBe('560 nm: Illuminant A 100; Illuminant D65 100');
		const readout = screen.getByTestId('spectrum-plot-readout');
		expect(readout).toHaveTextContent('560 nm');
		expect(within(readout).getAllByRole('listitem')).toHaveLength(2);
	});

	it('the table gives every line every 10 nm', async () => {
		render(SpectrumPlot, { title: 'tbl', series: [A], scale: 'at560' });
		await fireEvent.click(screen.getByRole('button', { name: 'Table' }));
		const table = screen.getByTestId('spectrum-plot-table');
		const rows = within(table).getAllByRole('row');
		expect(rows).toHaveLength(42);
		const r560 = rows.find((r) => within(r).queryByRole('rowheader')?.textContent === '560')!;
		expect(within(r560).getByRole('cell')).toHaveTextContent('100');
	});

	it('says plainly when there is no spectrum instead of drawing empty axes', () => {
		render(SpectrumPlot, { title: 'none', series: [], empty: 'No spectrum: a chromaticity reading.' });
		expect(screen.getByTestId('spectrum-plot-empty')).toHaveTextContent('No spectrum: a chromaticity reading.');
		expect(screen.queryByRole('slider')).toBeNull();
	});
});
