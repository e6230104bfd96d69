import { render, screen } from '@testing-library/svelte';
import { afterEach, describe, expect, it, vi } from 'vitest';
import Swatch from '$lib/components/log/Swatch.svelte';
import { displaySpace } from '$lib/components/log/display-space';

// A green at x 0.28, y 0.64: outside sRGB, inside Display P3 (both gamuts from their primaries,
// IEC 61966-2-1 and SMPTE EG 432-1).
const P3_GREEN = { x: 0.28, y: 0.64 };
// CIE 15:2004 Table T.3: D65, inside both.
const D65 = { x: 0.31272, y: 0.32903 };

function screenLike(p3: boolean) {
	vi.stubGlobal('matchMedia', (q: string) => ({ matches: p3 && q === '(color-gamut: p3)', addEventListener() {}, removeEventListener() {} }));
	vi.stubGlobal('CSS', { supports: (_p: string, v: string) => v.startsWith('color(display-p3') });
}
afterEach(() => vi.unstubAllGlobals());

describe('displaySpace', () => {
	it('P3 only when the screen covers it and the browser parses display-p3; sRGB otherwise and on the server', () => {
		expect(displaySpace({ matchMedia: () => ({ matches: true }), CSS: { supports: () => true } })).toBe('p3');
		expect(displaySpace({ matchMedia: () => ({ matches: true }), CSS: { supports: () => false } })).toBe('srgb');
		expect(displaySpace({ matchMedia: () => ({ matches: false }), CSS: { supports: () => true } })).toBe('srgb');
		expect(displaySpace({})).toBe('srgb');
		expect(displaySpace(undefined)).toBe('srgb');
		expect(displaySpace({ matchMedia: () => { throw new Error('no'); } })).toBe('srgb');
	});
});

describe('Swatch', () => {
	it('on an sRGB screen a green outside sRGB is gamut-mapped and says so', async () => {
		screenLike(false);
		render(Swatch, { xy: P3_GREEN, label: 'Tint', size: 'large', testid: 'sw' });
		const fig = screen.getByTestId('sw');
		expect(fig).toHaveAttribute('data-space', 'srgb');
		expect(fig).toHaveAttribute('data-mapped', 'true');
		expect(screen.getByTestId('swatch-mapped-note')).toHaveTextContent('outside the sRGB range');
		expect(screen.getByRole('img').getAttribute('style')).toMatch(/background-color: (#|rgb)/);
	});

	it('on a P3 screen the same green fits: drawn in display-p3, no note', async () => {
		screenLike(true);
		render(Swatch, { xy: P3_GREEN, label: 'Tint', size: 'large', testid: 'sw' });
		await vi.waitFor(() => expect(screen.getByTestId('sw')).toHaveAttribute('data-space', 'p3'));
		expect(screen.getByTestId('sw')).toHaveAttribute('data-mapped', 'false');
		expect(screen.queryByTestId('swatch-mapped-note')).toBeNull();
		expect(screen.getByText(/in Display P3/)).toBeInTheDocument();
	});

	it('D65 fits everywhere: no note; the chip says in its name when a tint was mapped', () => {
		screenLike(false);
		const { unmount } = render(Swatch, { xy: D65, label: 'D65', size: 'large', testid: 'sw' });
		expect(screen.queryByTestId('swatch-mapped-note')).toBeNull();
		unmount();
		render(Swatch, { xy: P3_GREEN, label: 'Tint of the key' });
		expect(screen.getByRole('img')).toHaveAccessibleName('Tint of the key (outside sRGB: shown gamut-mapped)');
	});

	it('still shows a stored sRGB hex as a chip', () => {
		render(Swatch, { hex: '#ffaa00', label: 'Tint' });
		expect(screen.getByRole('img', { name: 'Tint' }).getAttribute('style')).toMatch(/background-color/);
	});
});
