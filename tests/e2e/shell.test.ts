import { expect, test } from '@playwright/test';

test('the landing page says what Chromaslate does, in the shipped font, with no outside requests', async ({ page }) => {
	const outside: string[] = [];
	page.on('request', (req) => {
		const url = new URL(req.url());
		if (!['127.0.0.1', 'localhost'].includes(url.hostname) && !url.protocol.startsWith('data')) outside.push(req.url());
	});

	await page.goto('/');
	await expect(page.getByRole('link', { name: 'Chromaslate home' })).toBeVisible();
	await expect(page.getByTestId('pitch')).toContainText('CIE 1931');

	// The shipped variable font is loaded from our own origin and used by the body text.
	await page.evaluate(() => document.fonts.ready);
	const font = await page.evaluate(() => ({
		family: getComputedStyle(document.body).fontFamily,
		loaded: document.fonts.check('16px "Inter Variable"'),
		faces: [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family)
	}));
	expect(font.family).toContain('Inter Variable');
	expect(font.loaded).toBe(true);
	expect(font.faces).toContain('Inter Variable');

	expect(outside).toEqual([]);
});

test('the theme toggle switches between the dark set theme and the light desk theme, and sticks', async ({ page }) => {
	await page.goto('/');
	const html = page.locator('html');
	await expect(html).toHaveAttribute('data-theme', 'dark');
	const darkBg = await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);

	await page.getByTestId('theme-toggle').click();
	await expect(html).toHaveAttribute('data-theme', 'light');
	const lightBg = await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
	expect(lightBg).not.toBe(darkBg);

	// Rendered by the server from the cookie on the next visit, so there is no flash of the wrong theme.
	await page.reload();
	await expect(html).toHaveAttribute('data-theme', 'light');
});

test('theme colours from tailwind.config.ts reach the built CSS', async ({ page }) => {
	await page.goto('/');
	// `text-tally` exists only because tailwind.config.ts defines the "tally" colour (dark: #e9a23b).
	const colour = await page.locator('h3.text-tally').first().evaluate((el) => getComputedStyle(el).color);
	expect(colour).toBe('rgb(233, 162, 59)');
	// `min-h-touch` comes from the config's spacing scale (3rem = 48 px).
	const minHeight = await page.getByTestId('theme-toggle').evaluate((el) => getComputedStyle(el).minHeight);
	expect(minHeight).toBe('48px');
});

test('the health endpoint reports a database that answered a query', async ({ request }) => {
	const res = await request.get('/api/health');
	expect(res.status()).toBe(200);
	const body = await res.json();
	expect(body.ok).toBe(true);
	expect(body.db.version).toMatch(/MariaDB/);
});

test('an unknown page gets our own error page with a way back', async ({ page }) => {
	const res = await page.goto('/no-such-place');
	expect(res?.status()).toBe(404);
	await expect(page.getByTestId('error-page')).toContainText('Nothing here');
	await expect(page.getByRole('link', { name: 'Back to the start' })).toBeVisible();
});
