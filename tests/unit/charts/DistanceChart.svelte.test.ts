import { render, screen } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { CCTToXy, xyToUvPrime } from '$lib/colour';
import DistanceChart from '$lib/components/charts/DistanceChart.svelte';
import { DISTANCE_DEFAULT_WIDTH, DISTANCE_PLOT } from '$lib/charts/distance';

const D65 = { x: 0.31272, y: 0.32903 }; // CIE 15:2004 Table T.3: D65, 2° observer
const target = (tolerance = 0.002) => ({ ...D65, tolerance, label: 'Target' });
const inner = DISTANCE_PLOT.width - DISTANCE_PLOT.margin.left - DISTANCE_PLOT.margin.right;
const unit = inner / DISTANCE_DEFAULT_WIDTH; // user units per Δu′v′ in the default view

describe('DistanceChart', () => {
	it('draws the Duv grid at ±0.002, ±0.006, ±0.02 and the Planckian locus', () => {
		render(DistanceChart, { props: { readings: [], target: target() } });
		const duvs = screen.getAllByTestId('distance-chart-duv-line').map((g) => Number(g.getAttribute('data-duv')));
		expect(duvs).toEqual([-0.02, -0.006, -0.002, 0, 0.002, 0.006, 0.02]);
	});

	it('draws Δu′v′ circles of 0.001, 0.002 and 0.005 and the tolerance circle at its Δu′v′', () => {
		render(DistanceChart, { props: { readings: [], target: target(0.002) } });
		const circles = screen.getAllByTestId('distance-chart-delta-circle');
		expect(circles.map((c) => Number(c.getAttribute('data-radius')))).toEqual([0.001, 0.002, 0.005]);
		for (const c of circles) {
			const r = Number(c.querySelector('circle')!.getAttribute('r'));
			expect(r).toBeCloseTo(Number(c.getAttribute('data-radius')) * unit, 2);
		}
		const tol = screen.getByTestId('distance-chart-tolerance');
		expect(Number(tol.getAttribute('r')) / unit).toBeCloseTo(0.002, 6);
	});

	it('places a reading Δu′v′ 0.003 to the right of the target 0.003 × scale from it', () => {
		const t = xyToUvPrime(D65);
		// A reading defined in u′v′ and carried to xy (CIE 15:2004 eq. 8.2 inverted).
		const u = t.u_prime + 0.003;
		const v = t.v_prime;
		const d = 6 * u - 16 * v + 12;
		const xy = { x: (9 * u) / d, y: (4 * v) / d };
		render(DistanceChart, { props: { readings: [{ id: 'r', label: 'Off', ...xy }], target: target() } });
		const m = /translate\(([-\d.]+),([-\d.]+)\)/.exec(screen.getByTestId('distance-chart-point').getAttribute('transform')!)!;
		const centreX = DISTANCE_PLOT.margin.left + inner / 2;
		expect(Number(m[1]) - centreX).toBeCloseTo(0.003 * unit, 1);
	});

	it('shows the distance, the mired shift and the Duv change to the target in a reading’s details', async () => {
		const user = userEvent.setup();
		render(DistanceChart, { props: { readings: [{ id: 'w', label: 'Warm unit', ...CCTToXy(6000, 0.004) }], target: target() } });
		const point = screen.getByTestId('distance-chart-point');
		for (let i = 0; i < 12 && document.activeElement !== point; i++) await user.tab();
		const details = screen.getByTestId('distance-chart-details');
		expect(details).toHaveTextContent('Warm unit');
		expect(details).toHaveTextContent('Δu′v′ to target');
		// 10⁶/6504 − 10⁶/6000 ≈ −12.9 mired (D65 about 6504 K, CIE 15:2004 Table T.3); Duv about 0.0032 − 0.004.
		expect(details.textContent).toMatch(/Mired shift to target\s*−1[23]\.\d/);
		expect(details.textContent).toMatch(/Duv change to target\s*−0\.000\d/);
	});

	it('centres on the first reading when no target is set', () => {
		render(DistanceChart, { props: { readings: [{ id: 'a', label: 'Lamp', ...CCTToXy(3200, 0) }] } });
		const m = /translate\(([-\d.]+),([-\d.]+)\)/.exec(screen.getByTestId('distance-chart-point').getAttribute('transform')!)!;
		expect(Number(m[1])).toBeCloseTo(DISTANCE_PLOT.margin.left + inner / 2, 1);
		expect(screen.queryByTestId('distance-chart-tolerance')).toBeNull();
	});
});
