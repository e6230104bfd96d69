import { fireEvent, render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { CCTToXy, xyToUvPrime } from '$lib/colour';
import ChromaticityChart from '$lib/components/charts/ChromaticityChart.svelte';
import type { ChartReading } from '$lib/components/charts/types';

const D65 = { x: 0.31272, y: 0.32903 }; // CIE 15:2004 Table T.3: D65, 2° observer
const A = { x: 0.44757, y: 0.40745 }; // CIE 15:2004 Table T.3: illuminant A

const reading = (id: string, xy: { x: number; y: number }, extra: Partial<ChartReading> = {}): ChartReading => ({ id, label: `Light ${id}`, ...xy, ...extra });

function translateOf(el: Element): { x: number; y: number } {
	const m = /translate\(([-\d.]+),([-\d.]+)\)/.exec(el.getAttribute('transform') ?? '');
	if (!m) throw new Error('no translate');
	return { x: Number(m[1]), y: Number(m[2]) };
}

describe('ChromaticityChart', () => {
	it('CIE 15:2004 Table T.3: a reading at D65 is drawn where the scale puts it', () => {
		render(ChromaticityChart, { readings: [reading('d65', D65)] });
		const [point] = screen.getAllByTestId('xy-chart-point');
		// 48 + 0.31272 / 0.8 × 480 = 235.632; 12 + 540 − 0.32903 / 0.9 × 540 = 354.582 (rounded to 0.01).
		const p = translateOf(point);
		expect(p.x).toBeCloseTo(235.63, 2);
		expect(p.y).toBeCloseTo(354.58, 2);
	});

	it('fills each reading with its display swatch and gives each its own mark and label', () => {
		render(ChromaticityChart, { readings: [reading('k', A, { role: 'key' }), reading('f', D65, { role: 'fill' })] });
		const points = screen.getAllByTestId('xy-chart-point');
		const paths = points.map((p) => p.querySelector('path')!);
		expect(paths[0].getAttribute('fill')).not.toBe(paths[1].getAttribute('fill'));
		expect(paths[0].getAttribute('d')).not.toBe(paths[1].getAttribute('d'));
		expect(points[0]).toHaveTextContent('Light k');
		expect(points[0].getAttribute('aria-label')).toMatch(/^Light k: x 0\.4476, y 0\.407[45]$/);
		// Illuminant A shows as a warm swatch: more red than blue.
		const hex = paths[0].getAttribute('fill')!;
		expect(parseInt(hex.slice(1, 3), 16)).toBeGreaterThan(parseInt(hex.slice(5, 7), 16));
	});

	it('draws a Planckian tick at 3200 K on the locus at CCTToXy(3200, 0)', () => {
		render(ChromaticityChart, { readings: [] });
		const tick = screen.getAllByTestId('xy-chart-cct-tick').find((t) => t.getAttribute('data-kelvin') === '3200')!;
		expect(tick).toBeDefined();
		const core = CCTToXy(3200, 0);
		expect(Math.abs(Number(tick.getAttribute('data-x')) - core.x)).toBeLessThan(1e-6);
		expect(Math.abs(Number(tick.getAttribute('data-y')) - core.y)).toBeLessThan(1e-6);
		expect(tick).toHaveTextContent('3200 K');
	});

	it('draws the target’s Δu′v′ tolerance as a closed curve 0.002 from it in u′v′', () => {
		const target = { ...D65, tolerance: 0.002, label: 'Target white' };
		render(ChromaticityChart, { props: { readings: [], target } });
		const d = screen.getByTestId('xy-chart-tolerance').getAttribute('d')!;
		expect(d.endsWith('Z')).toBe(true);
		// Back from the drawing (600 units per unit, origin at 48, 552) to xy and u′v′.
		const c = xyToUvPrime(D65);
		const pts = [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => ({ x: (Number(m[1]) - 48) / 600, y: (552 - Number(m[2])) / 600 }));
		expect(pts.length).toBeGreaterThan(40);
		for (const p of pts) {
			const q = xyToUvPrime(p);
			// Path coordinates are rounded to 0.01 units (1.7e-5 in x, y): Δu′v′ within 3e-5.
			expect(Math.abs(Math.hypot(q.u_prime - c.u_prime, q.v_prime - c.v_prime) - 0.002)).toBeLessThan(3e-5);
		}
		expect(screen.getAllByText('Target white').length).toBeGreaterThan(0);
	});

	it('draws one arrow per proposal, from now to predicted', () => {
		render(ChromaticityChart, {
			readings: [reading('a', A)],
			arrows: [{ from: A, to: CCTToXy(5600, 0), label: 'Full CTB' }]
		});
		const [arrow] = screen.getAllByTestId('xy-chart-arrow');
		expect(arrow).toHaveTextContent('Full CTB');
		expect(arrow.querySelector('line')).not.toBeNull();
	});

	it('keyboard: tabbing reaches a point and its details show its label', async () => {
		const user = userEvent.setup();
		render(ChromaticityChart, { readings: [reading('d65', D65, { label: 'Window key' })] });
		const point = screen.getByTestId('xy-chart-point');
		for (let i = 0; i < 12 && document.activeElement !== point; i++) await user.tab();
		expect(point).toHaveFocus();
		const details = screen.getByTestId('xy-chart-details');
		expect(details).toHaveTextContent('Window key');
		expect(details).toHaveTextContent('0.3127');
		// CIE 15:2004 Table T.3: D65 is about 6504 K.
		expect(details.textContent).toMatch(/650[0-9] K/);
	});

	it('zooms with the buttons and resets', async () => {
		const user = userEvent.setup();
		const { container } = render(ChromaticityChart, { readings: [reading('d65', D65)] });
		const svg = container.querySelector('svg[data-zoom]')!;
		expect(svg.getAttribute('data-zoom')).toBe('1.000');
		await user.click(screen.getByRole('button', { name: 'Zoom in' }));
		expect(svg.getAttribute('data-zoom')).toBe('1.500');
		await user.click(screen.getByRole('button', { name: 'Zoom out' }));
		await user.click(screen.getByRole('button', { name: 'Zoom in' }));
		await user.click(screen.getByRole('button', { name: 'Reset view' }));
		expect(svg.getAttribute('data-zoom')).toBe('1.000');
	});

	it('offers the same values as a table', async () => {
		const user = userEvent.setup();
		render(ChromaticityChart, { readings: [reading('d65', D65, { label: 'Window key' }), reading('a', A, { label: 'Lamp' })] });
		expect(screen.queryByTestId('xy-chart-table')).toBeNull();
		await user.click(screen.getByRole('button', { name: 'Table' }));
		const table = screen.getByTestId('xy-chart-table');
		const rows = within(table).getAllByRole('row');
		expect(rows).toHaveLength(3);
		expect(rows[1]).toHaveTextContent('Window key');
		expect(rows[2]).toHaveTextContent('0.4476');
	});

	it('draws large sets on a canvas layer, with one keyboard stop that steps through them', async () => {
		const readings = Array.from({ length: 600 }, (_, i) => reading(String(i), CCTToXy(2000 + i * 10, 0)));
		const { container } = render(ChromaticityChart, { readings });
		expect(screen.queryAllByTestId('xy-chart-point')).toHaveLength(0);
		expect(container.querySelector('canvas[data-canvas-marks]')).not.toBeNull();
		const layer = screen.getByTestId('xy-chart-layer');
		layer.focus();
		await fireEvent.keyDown(layer, { key: 'ArrowRight' });
		expect(screen.getByTestId('xy-chart-details')).toHaveTextContent('Light 0');
		await fireEvent.keyDown(layer, { key: 'ArrowLeft' });
		expect(screen.getByTestId('xy-chart-details')).toHaveTextContent('Light 599');
	});

	it('switches the daylight locus and the Duv ±0.006 band', async () => {
		const user = userEvent.setup();
		render(ChromaticityChart, { readings: [] });
		expect(screen.getByTestId('xy-chart-daylight-locus')).toBeInTheDocument();
		expect(screen.queryByTestId('xy-chart-duv-band')).toBeNull();
		await user.click(screen.getByLabelText('Duv ±0.006 band'));
		expect(screen.getByTestId('xy-chart-duv-band')).toBeInTheDocument();
		await user.click(screen.getByLabelText('CIE daylight locus'));
		expect(screen.queryByTestId('xy-chart-daylight-locus')).toBeNull();
	});

	it('draws the eight ANSI C78.377 quadrangles (2700–6500 K) when asked, with a key entry', async () => {
		const user = userEvent.setup();
		render(ChromaticityChart, { readings: [] });
		expect(screen.queryByTestId('xy-chart-quadrangles')).toBeNull();
		await user.click(screen.getByLabelText('ANSI C78.377 quadrangles'));
		const group = screen.getByTestId('xy-chart-quadrangles');
		const nominals = [...group.querySelectorAll('path')].map((p) => Number(p.getAttribute('data-nominal')));
		expect(nominals).toEqual([2700, 3000, 3500, 4000, 4500, 5000, 5700, 6500]);
		expect(screen.getByRole('list', { name: 'Key' })).toHaveTextContent('ANSI C78.377 nominal-CCT quadrangles');
	});
});
