import { render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import GelFixCard from '$lib/components/bench/GelFixCard.svelte';
import LedFixCard from '$lib/components/bench/LedFixCard.svelte';
import { channel, gelProposal, ledFix } from './factories';

describe('GelFixCard', () => {
	it('shows the stack, predicted CCT/Duv/Ra, what is left, light lost and the mired shift', () => {
		render(GelFixCard, { proposal: gelProposal(), tolerance: 0.002, canAccept: true });
		expect(screen.getByTestId('gel-fix-label')).toHaveTextContent('Full CTB');
		expect(screen.getByTestId('gel-cct')).toHaveTextContent('5,500 K');
		expect(screen.getByTestId('gel-residual')).toHaveTextContent('Δu′v′ 0.0012 ✓ within tolerance');
		expect(screen.getByTestId('gel-loss')).toHaveTextContent('1.4 stops');
		expect(screen.getByTestId('gel-fix')).toHaveTextContent('−131 mired (on this light −128 mired)');
		expect(screen.getByTestId('gel-fix')).toHaveTextContent('98');
		expect(screen.queryByTestId('estimate-flag')).toBeNull();
	});
	it('flags an estimate, and says Ra needs a spectrum', () => {
		render(GelFixCard, { proposal: gelProposal({ estimate: true, within: false, residual: 0.0041, predicted: { x: 0.33, y: 0.34, CCT: 5200, Duv: 0.002, Ra: null } }), tolerance: 0.002, canAccept: false });
		expect(screen.getByTestId('estimate-flag')).toHaveTextContent('estimate');
		expect(screen.getByTestId('gel-residual')).toHaveTextContent('△ outside 0.002');
		expect(screen.getByTestId('gel-fix')).toHaveTextContent('— (needs a spectrum)');
	});
	it('Accept shows only to those who may accept, and records through the callback', async () => {
		const onaccept = vi.fn(async () => {});
		const { unmount } = render(GelFixCard, { proposal: gelProposal(), tolerance: 0.002, canAccept: false, onaccept });
		expect(screen.queryByRole('button', { name: /accept/i })).toBeNull();
		unmount();
		render(GelFixCard, { proposal: gelProposal(), tolerance: 0.002, canAccept: true, onaccept });
		await userEvent.setup().click(screen.getByRole('button', { name: 'Accept this gel fix' }));
		expect(onaccept).toHaveBeenCalledOnce();
	});
	it('a refused accept shows the reason', async () => {
		render(GelFixCard, { proposal: gelProposal(), tolerance: 0.002, canAccept: true, onaccept: async () => { throw new Error('The setup is locked.'); } });
		await userEvent.setup().click(screen.getByRole('button', { name: 'Accept this gel fix' }));
		expect(await screen.findByRole('alert')).toHaveTextContent('The setup is locked.');
	});
});

describe('LedFixCard', () => {
	it('levels in % with DMX 8-bit and 16-bit coarse/fine (DMX512 two-slot 16-bit, common practice)', () => {
		render(LedFixCard, { fix: ledFix(), tolerance: 0.002, canAccept: true });
		const rows = screen.getAllByTestId('led-channel');
		expect(rows).toHaveLength(4);
		// 0.75 → 8-bit round(191.25) = 191; 16-bit round(49151.25) = 49151 = 191 × 256 + 255.
		expect(within(rows[0]).getAllByRole('cell').map((c) => c.textContent?.replace(/\u00a0/g, ' '))).toEqual(['75.0 %', '191', '191 / 255']);
		// 0.25 → 8-bit round(63.75) = 64; 16-bit round(16383.75) = 16384 = 64 × 256 + 0.
		expect(within(rows[1]).getAllByRole('cell').map((c) => c.textContent?.replace(/\u00a0/g, ' '))).toEqual(['25.0 %', '64', '64 / 0']);
		expect(within(rows[3]).getAllByRole('cell').map((c) => c.textContent?.replace(/\u00a0/g, ' '))).toEqual(['100.0 %', '255', '255 / 255']);
		expect(screen.getByTestId('led-cct')).toHaveTextContent('5,500 K');
		expect(screen.getByTestId('led-output')).toHaveTextContent('62 %');
		expect(screen.getByTestId('led-gamut')).toHaveTextContent('In gamut. Met exactly');
		expect(screen.getByRole('button', { name: 'Accept this LED fix' })).toBeInTheDocument();
	});
	it('out of gamut, and a bi-colour CCT with green/magenta', () => {
		render(LedFixCard, {
			fix: ledFix({ inGamut: false, note: 'Aimed at the nearest reachable white.', channels: [channel('WW', 'Warm white', 0.4), channel('CW', 'Cool white', 1)], bicolour: { cctSettingK: 4300, mixDuv: 0.001, greenMagentaDuv: -0.0021, note: 'Add minus green for the rest.' } }),
			tolerance: 0.002,
			canAccept: false
		});
		expect(screen.getByTestId('led-gamut')).toHaveTextContent('Outside the gamut. Aimed at the nearest reachable white.');
		expect(screen.getByTestId('led-bicolour')).toHaveTextContent('Bi-colour: set 4,300 K, green/magenta −0.0021 Duv');
		expect(screen.queryByRole('button', { name: /accept/i })).toBeNull();
	});
});
