import { render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import BenchDistance from '$lib/components/bench/BenchDistance.svelte';
import LightList from '$lib/components/bench/LightList.svelte';
import { distance, light, mired, reading } from './factories';

describe('BenchDistance', () => {
	it('3200 K against a 5600 K target: Δu′v′, off target in words and icon, −134 mired (arithmetic), Duv', () => {
		const d = distance({ duv_prime: 0.0521, mired: mired(5600) - mired(3200), dDuv: -0.0012, within: false });
		render(BenchDistance, { distance: d, tolerance: 0.002 });
		const el = screen.getByTestId('bench-distance');
		expect(el).toHaveAttribute('data-within', 'false');
		expect(el).toHaveTextContent('Δu′v′ 0.0521');
		expect(screen.getByTestId('bench-verdict')).toHaveTextContent('off target (26.1 × the tolerance)');
		expect(el).toHaveTextContent('−134 mired');
		expect(el).toHaveTextContent('Duv −0.0012');
		expect(el).toHaveTextContent('needs cooler (toward CTB), minus green');
		expect(el.textContent).toContain('!');
	});
	it('within the tolerance: on target, with a check mark', () => {
		render(BenchDistance, { distance: distance({ duv_prime: 0.0008 }), tolerance: 0.002 });
		expect(screen.getByTestId('bench-verdict')).toHaveTextContent(/on target/);
		expect(screen.getByTestId('bench-distance').textContent).toContain('✓');
	});
	it('no distance (no target or no reading)', () => {
		render(BenchDistance, { distance: null, tolerance: 0.002 });
		expect(screen.getByTestId('bench-distance')).toHaveTextContent('No distance yet');
	});
});

describe('LightList', () => {
	const lights = () => [
		light({ id: 1, label: 'Far back', role: 'back', lastReading: reading({ distance: distance({ duv_prime: 0.03, within: false }) }) }),
		light({ id: 2, label: 'Unread fill', role: 'fill', lastReading: null }),
		light({ id: 3, label: 'Near key', lastReading: reading({ distance: distance({ duv_prime: 0.0004 }) }), latestFix: { kind: 'gel', setting: 'Full CTB', acceptedBy: 'Test gaffer', acceptedAt: '2026-12-01T21:00:00Z' } })
	];

	it('lists lights nearest first, says which have no reading, shows accepted fixes', () => {
		render(LightList, { lights: lights(), tolerance: 0.002, onselect: () => {} });
		const items = screen.getAllByTestId('bench-light');
		expect(items.map((i) => i.getAttribute('data-light-id'))).toEqual(['3', '1', '2']);
		expect(within(items[0]).getByTestId('bench-verdict')).toHaveTextContent(/on target/);
		expect(within(items[1]).getByTestId('bench-verdict')).toHaveTextContent(/off target/);
		expect(items[2]).toHaveTextContent('No reading yet.');
		expect(within(items[0]).getByTestId('bench-accepted')).toHaveTextContent('Accepted gel fix: Full CTB');
	});

	it('selects a light on tap and marks it pressed', async () => {
		const onselect = vi.fn();
		const user = userEvent.setup();
		const { rerender } = render(LightList, { lights: lights(), tolerance: 0.002, onselect });
		await user.click(screen.getByRole('button', { name: /Far back/ }));
		expect(onselect).toHaveBeenCalledWith(1);
		await rerender({ lights: lights(), tolerance: 0.002, onselect, selected: 1 });
		expect(screen.getByRole('button', { name: /Far back/ })).toHaveAttribute('aria-pressed', 'true');
		expect(screen.getByRole('button', { name: /Near key/ })).toHaveAttribute('aria-pressed', 'false');
	});

	it('an empty setup says so', () => {
		render(LightList, { lights: [], tolerance: 0.002, onselect: () => {} });
		expect(screen.getByText(/No lights in this setup yet/)).toBeInTheDocument();
	});
});
