import { render, screen } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import AppHeader from '$lib/components/shell/AppHeader.svelte';
import { NAV_ITEMS } from '$lib/nav';

describe('AppHeader', () => {
	it('names the product and lists every area of the navigation', () => {
		render(AppHeader, { items: NAV_ITEMS });
		expect(screen.getByRole('link', { name: 'Chromaslate home' })).toHaveTextContent('Chromaslate');
		const nav = screen.getByRole('navigation', { name: 'Main' });
		for (const item of NAV_ITEMS) expect(nav).toHaveTextContent(item.label);
	});

	it('marks the current area and links the ones that exist', () => {
		const items = [
			{ label: 'Lab', href: '/lab', description: 'teaching' },
			{ label: 'Later', href: null, description: 'not yet' }
		];
		render(AppHeader, { items, current: '/lab/worksheet' });
		expect(screen.getByRole('link', { name: 'Lab' })).toHaveAttribute('aria-current', 'page');
		expect(screen.queryByRole('link', { name: /Later/ })).toBeNull();
	});

	it('toggles the theme on the document and remembers it in a cookie', async () => {
		render(AppHeader, { items: NAV_ITEMS, theme: 'dark' });
		const button = screen.getByTestId('theme-toggle');
		expect(button).toHaveAttribute('aria-pressed', 'false');
		await userEvent.click(button);
		expect(document.documentElement.dataset.theme).toBe('light');
		expect(document.cookie).toContain('cs_theme=light');
		expect(button).toHaveAttribute('aria-pressed', 'true');
	});
});
