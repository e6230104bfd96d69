import { render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import ToolsPage from '../../../src/routes/tools/+page.svelte';
import { NAV_ITEMS } from '$lib/nav';

describe('the set tools page', () => {
	it('is linked from the header and holds both tools under their anchors', () => {
		expect(NAV_ITEMS.find((i) => i.label === 'Set tools')?.href).toBe('/tools');
		const { container } = render(ToolsPage);
		expect(screen.getByRole('heading', { level: 1, name: 'Set tools' })).toBeInTheDocument();
		expect(container.querySelector('#shutter')).toHaveAccessibleName('Flicker-safe shutter');
		expect(container.querySelector('#power')).toHaveAccessibleName('Power budget');
		expect(screen.getByRole('link', { name: 'Flicker-safe shutter' })).toHaveAttribute('href', '#shutter');
		expect(screen.getByRole('link', { name: 'Power budget' })).toHaveAttribute('href', '#power');
	});
});
