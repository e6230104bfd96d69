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

describe('AppHeader account area', () => {
	it('offers sign-in to a visitor and sign-out to a signed-in person', () => {
		const { unmount } = render(AppHeader, { items: NAV_ITEMS });
		expect(screen.getByTestId('header-sign-in')).toHaveAttribute('href', '/sign-in');
		unmount();
		render(AppHeader, { items: NAV_ITEMS, user: { name: 'Demo Gaffer', email: 'demo.gaffer@example.test' } });
		expect(screen.queryByTestId('header-sign-in')).toBeNull();
		expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
		expect(screen.getByTestId('header-account')).toHaveAttribute('action', '/sign-out');
		expect(screen.getByTestId('header-account-link')).toHaveAttribute('href', '/account');
		expect(screen.getByTestId('header-account-link')).toHaveAttribute('title', 'Your account: demo.gaffer@example.test');
	});
});
