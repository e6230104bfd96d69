import { render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { CCTToXy, uvPrimeToXy, xyToUvPrime } from '$lib/colour';
import ChromaticityChart from '$lib/components/charts/ChromaticityChart.svelte';
import DistanceChart from '$lib/components/charts/DistanceChart.svelte';
import { labelBox, overlaps, type Box } from '$lib/charts/labels';
import { domainAround } from '$lib/charts/viewport';
import { XY_PLOT } from '$lib/charts/cie1931';

// A crowded bench: one tungsten light (3200 K) and five fixes all predicted within Δu′v′ 0.0006 of a
// 4000 K target (CCTs on the Planckian locus, CIE 15:2004 §9.5; invented fixes).
const target = { ...CCTToXy(4000, 0), tolerance: 0.002, label: 'Target white' };
const now = CCTToXy(3200, 0);
const near = (du: number, dv: number) => {
	const t = xyToUvPrime(target);
	return uvPrimeToXy({ u_prime: t.u_prime + du, v_prime: t.v_prime + dv });
};
const labels = ['Full CTB + ⅛ CTB', '¾ CTB + ¼ CTB', 'Full CTB + ¼ plus green', '¾ CTB', 'LED fix'];
const ends = [near(0.0002, 0.0001), near(-0.0003, 0.0002), near(0.0001, -0.0004), near(0.0005, 0), near(-0.0001, -0.0002)];
const arrows = ends.map((to, i) => ({ from: now, to, label: labels[i] }));
const readings = [{ id: 'k', label: 'Tungsten key', x: now.x, y: now.y }];

/** Each drawn arrow label's box, from its own position, anchor, size and text (pad 0). */
function boxes(testid: string): Array<{ text: string; box: Box }> {
	return screen.getAllByTestId(`${testid}-arrow-label`).map((t) => ({
		text: t.textContent!,
		box: labelBox({ x: Number(t.getAttribute('x')), y: Number(t.getAttribute('y')), text: t.textContent!, anchor: t.getAttribute('text-anchor') as 'middle' }, Number(t.getAttribute('font-size')), 0)
	}));
}
function expectNoOverlap(list: Array<{ text: string; box: Box }>) {
	for (let i = 0; i < list.length; i++) for (let j = i + 1; j < list.length; j++) expect(overlaps(list[i].box, list[j].box), `${list[i].text} overlaps ${list[j].text}`).toBe(false);
}

describe('fix-arrow labels when several fixes end near the target', () => {
	it('distance chart: every arrow is labelled (in full or by its number) and no two labels overlap', () => {
		render(DistanceChart, { props: { readings, target, arrows } });
		const list = boxes('distance-chart');
		expect(list).toHaveLength(arrows.length);
		expectNoOverlap(list);
		// Whatever is shown only as a number is named in the key.
		expect(screen.getByTestId('distance-chart-arrow-key')).toHaveTextContent('5 LED fix');
		for (const l of list) if (/^\d$/.test(l.text)) expect(labels[Number(l.text) - 1]).toBeDefined();
	});

	it('distance chart: no label sits on the target’s own label', () => {
		render(DistanceChart, { props: { readings, target, arrows } });
		const targetText = screen.getAllByText('Target white').find((e) => e.tagName.toLowerCase() === 'text')!;
		const tb = labelBox({ x: Number(targetText.getAttribute('x')), y: Number(targetText.getAttribute('y')), text: 'Target white', anchor: 'end' }, 11, 0);
		for (const l of boxes('distance-chart')) expect(overlaps(l.box, tb), l.text).toBe(false);
	});

	it('CIE 1931 chart zoomed on the target: no two labels overlap', () => {
		const home = domainAround({ x: (now.x + target.x) / 2, y: (now.y + target.y) / 2 }, 0.12, XY_PLOT);
		render(ChromaticityChart, { props: { readings, target, arrows, home } });
		const list = boxes('xy-chart');
		expect(list).toHaveLength(arrows.length);
		expectNoOverlap(list);
	});
});
