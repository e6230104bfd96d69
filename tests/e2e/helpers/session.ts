import { expect, type Page } from '@playwright/test';

/** The invented demo accounts that scripts/seed.ts creates (demo only). */
export const DEMO_PASSWORD = 'night-wash-demo';
export const demoEmail = (role: 'owner' | 'dp' | 'gaffer' | 'colorist' | 'viewer' | 'admin') => `demo.${role}@example.test`;

/**
 * Opens a page and waits until the app has hydrated it (the root layout marks <html>), so typing and
 * file choices are not lost to a page still taking over from the server's HTML on a busy machine.
 */
export async function gotoReady(page: Page, url: string): Promise<void> {
	await page.goto(url);
	await hydrated(page);
}

/** Waits until the page in view has hydrated (after a click that may have loaded a new document). */
export async function hydrated(page: Page): Promise<void> {
	await page.locator('html[data-hydrated="true"]').waitFor({ state: 'attached' });
}

/** Signs in through the sign-in page, as a person would. */
export async function signIn(page: Page, role: Parameters<typeof demoEmail>[0]): Promise<void> {
	await gotoReady(page, '/sign-in');
	await page.locator('form[action="?/password"] input[name="email"]').fill(demoEmail(role));
	await page.locator('form[action="?/password"] input[name="password"]').fill(DEMO_PASSWORD);
	await page.locator('form[action="?/password"] button[type="submit"]').click();
	await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

/** Opens the demo project from the projects list and returns its base path (e.g. /projects/3). */
export async function openDemoProject(page: Page): Promise<string> {
	await page.goto('/projects');
	const link = page.getByTestId('project-list').getByRole('link').filter({ hasText: '(demo)' }).first();
	await expect(link).toBeVisible();
	const href = await link.getAttribute('href');
	if (!href) throw new Error('The demo project card has no link.');
	return new URL(href, 'http://x').pathname.replace(/\/$/, '');
}

export async function screenshot(page: Page, name: string, width: number): Promise<void> {
	await page.setViewportSize({ width, height: width < 600 ? 780 : 900 });
	await page.screenshot({ path: `${process.env.TEST_RESULTS_DIR ?? '.data/test-results'}/screenshots/${name}-${width}.png`, fullPage: true });
}
