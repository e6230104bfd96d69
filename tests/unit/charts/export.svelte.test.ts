import { render } from '@testing-library/svelte';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CCTToXy } from '$lib/colour';
import ChromaticityChart from '$lib/components/charts/ChromaticityChart.svelte';
import { resolveVars, serializeChart } from '$lib/components/charts/export';

const THEME = { '--cs-ink': '#d9d4cb', '--cs-ink-muted': '#9c978e', '--cs-line': '#2e2e34', '--cs-surface': '#121214', '--cs-surface-raised': '#1c1c20', '--cs-surface-sunken': '#0b0b0c', '--cs-tally': '#e9a23b', '--cs-cue': '#4fbfcb', '--cs-ink-faint': '#6a665f' };

describe('saving a chart', () => {
	beforeEach(() => {
		for (const [k, v] of Object.entries(THEME)) document.documentElement.style.setProperty(k, v);
	});
	afterEach(() => document.documentElement.removeAttribute('style'));

	it('resolves theme variables to the colours on screen', () => {
		expect(resolveVars('var(--cs-tally)', document.documentElement)).toBe('#e9a23b');
		expect(resolveVars('var(--cs-nothing, #123456)', document.documentElement)).toBe('#123456');
		expect(resolveVars('#abcdef', document.documentElement)).toBe('#abcdef');
	});

	it('writes a standalone SVG: namespace, size, background, no variables or interactive attributes', () => {
		const { container } = render(ChromaticityChart, { readings: [{ id: 'a', label: 'Lamp', ...CCTToXy(3200, 0) }] });
		const svg = container.querySelector('svg[data-zoom]') as SVGSVGElement;
		const out = serializeChart(svg, [], 'Test chart');
		expect(out.startsWith('<?xml')).toBe(true);
		expect(out).toContain('xmlns="http://www.w3.org/2000/svg"');
		expect(out).toContain('width="540"');
		expect(out).toContain('<title>Test chart</title>');
		expect(out).not.toContain('var(');
		expect(out).not.toContain('tabindex');
		expect(out).toContain('#121214');
		// Marks are sized by a class rule on screen; the file carries their scale itself.
		expect(out).toMatch(/class="mark[^"]*"[^>]*transform="scale\(1\)"|transform="scale\(1\)"[^>]*class="mark/);
		const doc = new DOMParser().parseFromString(out, 'image/svg+xml');
		expect(doc.querySelector('parsererror')).toBeNull();
	});

	it('writes the canvas layer of a large set back as vector marks', () => {
		const readings = Array.from({ length: 520 }, (_, i) => ({ id: String(i), label: `R${i}`, ...CCTToXy(2500 + i * 5, 0) }));
		const { container } = render(ChromaticityChart, { readings });
		const svg = container.querySelector('svg[data-zoom]') as SVGSVGElement;
		const marks = readings.slice(0, 3).map((_, i) => ({ x: 100 + i, y: 100, fill: '#ff8800', shape: 'circle' as const, area: 30 }));
		const out = serializeChart(svg, marks);
		expect(out).not.toContain('foreignObject');
		expect(out.match(/fill="#ff8800"/g)).toHaveLength(3);
	});
});
