import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it, vi } from 'vitest';
import BenchSpectrum from '$lib/components/bench/BenchSpectrum.svelte';
import { gelProposal, light } from './factories';

/** A 3200 K-ish line and a flat half-transmission stack on 380–780 nm at 10 nm (invented test data). */
const grid = (f: (nm: number) => number) => Array.from({ length: 41 }, (_, i) => f(380 + i * 10));
const spectra = (stack: string | null, spectral = true) => ({
	light: { id: 7, label: 'Key' },
	reading: { id: 70, label: 'Key as found', spectral },
	lines: spectral
		? [
				{ id: 'reading-70', label: 'Key as found', role: 'reading', spectrum: { start: 380, interval: 10, values: grid((nm) => nm / 780), scale: 'relative' } },
				{ id: 'target', label: 'Target white as CIE daylight at 5600 K', role: 'target', spectrum: { start: 380, interval: 10, values: grid(() => 1), scale: 'relative' } },
				...(stack ? [{ id: 'predicted', label: `Predicted through ${stack}`, role: 'predicted', spectrum: { start: 380, interval: 10, values: grid((nm) => nm / 1560), scale: 'relative' } }] : [])
			]
		: [],
	transmissions: stack ? [{ id: 'stack', label: stack, transmission: { start: 380, interval: 10, values: grid(() => 0.5) } }] : [],
	stack: stack ? { ids: [stack], label: stack } : null
});

function fakeFetch(spectral = true) {
	return vi.fn(async (url: string) => {
		const stack = new URL(url, 'http://x').searchParams.get('stack');
		return new Response(JSON.stringify(spectra(stack, spectral)), { status: 200, headers: { 'content-type': 'application/json' } });
	}) as unknown as typeof fetch & ReturnType<typeof vi.fn>;
}

const proposals = [gelProposal({ rank: 1, gels: [{ id: 'ctb-full', label: 'Full CTB' }], label: 'Full CTB' }), gelProposal({ rank: 2, gels: [{ id: 'ctb-half', label: '½ CTB' }, { id: 'ctb-quarter', label: '¼ CTB' }], label: '½ CTB + ¼ CTB' }), gelProposal({ rank: 3, gels: [], label: 'no filter' })];

describe('BenchSpectrum', () => {
	it('plots the light against the target through the best gel stack, with its transmission on the second axis', async () => {
		const fetcher = fakeFetch();
		render(BenchSpectrum, { projectId: 3, light: light({ id: 7, label: 'Key', lastReading: { ...light().lastReading!, id: 70 } }), proposals, fetcher });
		await vi.waitFor(() => expect(screen.getByTestId('bench-spectrum-plot')).toBeInTheDocument());
		expect(String(fetcher.mock.calls.at(-1)![0])).toBe('/api/v1/projects/3/lights/7/spectra?reading=70&stack=ctb-full');
		expect(screen.getAllByTestId('bench-spectrum-plot-line').map((l) => l.getAttribute('data-role'))).toEqual(['reading', 'target', 'predicted']);
		expect(screen.getByTestId('bench-spectrum-plot-transmission')).toBeInTheDocument();
		// "no filter" has nothing to plot and is not offered; the light as measured is.
		const options = [...(screen.getByTestId('bench-spectrum-stack') as HTMLSelectElement).options].map((o) => o.textContent);
		expect(options).toEqual(['No gel: the light as measured', 'Full CTB', '½ CTB + ¼ CTB']);
	});

	it('another stack, or none, asks again and redraws', async () => {
		const fetcher = fakeFetch();
		render(BenchSpectrum, { projectId: 3, light: light({ id: 7, label: 'Key', lastReading: { ...light().lastReading!, id: 70 } }), proposals, fetcher });
		await vi.waitFor(() => expect(screen.getByTestId('bench-spectrum-plot')).toBeInTheDocument());
		await fireEvent.change(screen.getByTestId('bench-spectrum-stack'), { target: { value: 'ctb-half,ctb-quarter' } });
		await vi.waitFor(() => expect(String(fetcher.mock.calls.at(-1)![0])).toContain('stack=ctb-half%2Cctb-quarter'));
		await fireEvent.change(screen.getByTestId('bench-spectrum-stack'), { target: { value: '' } });
		await vi.waitFor(() => expect(screen.queryByTestId('bench-spectrum-plot-transmission')).toBeNull());
		expect(String(fetcher.mock.calls.at(-1)![0])).toBe('/api/v1/projects/3/lights/7/spectra?reading=70');
	});

	it('a chromaticity-only reading says there is no spectrum instead of drawing empty charts', async () => {
		render(BenchSpectrum, { projectId: 3, light: light({ id: 7, label: 'Key' }), proposals, fetcher: fakeFetch(false) });
		await vi.waitFor(() => expect(screen.getByTestId('bench-spectrum-none')).toHaveTextContent('No spectrum'));
		expect(screen.queryByTestId('bench-spectrum-plot')).toBeNull();
		expect(screen.queryByRole('slider')).toBeNull();
	});

	it('a light without a reading asks for nothing', () => {
		const fetcher = fakeFetch();
		render(BenchSpectrum, { projectId: 3, light: light({ lastReading: null }), proposals, fetcher });
		expect(screen.getByTestId('bench-spectrum')).toHaveTextContent('No reading of this light yet');
		expect(fetcher).not.toHaveBeenCalled();
	});
});
