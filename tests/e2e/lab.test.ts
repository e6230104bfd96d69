import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';

const SHOTS = join(process.env.TEST_RESULTS_DIR ?? '.data/test-results', 'screenshots');

test.describe('mired lab', () => {
	test('opens without signing in, converts 3200 K and shows the worked example', async ({ page }) => {
		const res = await page.goto('/lab');
		expect(res?.status()).toBe(200);
		await expect(page.getByRole('heading', { level: 1, name: 'Mired lab' })).toBeVisible();
		await expect(page.getByRole('link', { name: 'Mired lab' })).toHaveAttribute('aria-current', 'page');

		const kelvin = page.getByTestId('converter-kelvin');
		await kelvin.fill('3200');
		// Mired = 10⁶ / K: 10⁶ / 3200 = 312.5 (common practice).
		await expect(page.getByTestId('converter-mired')).toHaveValue('312.5');
		await page.getByTestId('converter-mired').fill('200');
		await expect(kelvin).toHaveValue('5000');

		// Worked example 3200 → 5600 K: 10⁶/5600 − 10⁶/3200 = −133.9 mired.
		await expect(page.getByTestId('gel-step-shift')).toContainText('−133.9 mired');
		await page.getByRole('button', { name: '3092 → 5600 K' }).click();
		// 3092 → 5600 K needs −144.8 mired (common practice worked example).
		await expect(page.getByTestId('gel-step-shift')).toContainText('−144.8 mired');
	});

	test('the equal-steps chart gives a point’s values by keyboard', async ({ page }) => {
		await page.goto('/lab');
		const point = page.getByTestId('steps-chart-point').first();
		await point.focus();
		await expect(page.getByTestId('steps-chart-details')).toContainText('2000 K');
		await expect(page.getByTestId('steps-chart-details')).toContainText('CCT');
		const chart = page.getByTestId('steps-chart').locator('svg[data-zoom]');
		const before = Number(await chart.getAttribute('data-zoom'));
		await page.getByTestId('steps-chart').getByRole('button', { name: 'Zoom in' }).click();
		await expect.poll(async () => Number(await chart.getAttribute('data-zoom'))).toBeCloseTo(before * 1.5, 2);
	});

	test('a new worksheet set changes the exercises and the link, and the key follows', async ({ page }) => {
		await page.goto('/lab?set=4821');
		await expect(page.getByTestId('worksheet')).toContainText('set 4821');
		const before = await page.getByTestId('worksheet-question').allTextContents();
		await page.getByTestId('worksheet-new').click();
		await expect(page).toHaveURL(/\?set=\d+/);
		await expect(page.getByTestId('worksheet')).not.toContainText('set 4821');
		const set = new URL(page.url()).searchParams.get('set');
		await expect(page.getByTestId('worksheet-key')).toContainText(`Answer key · set ${set}`);
		expect(await page.getByTestId('worksheet-question').allTextContents()).not.toEqual(before);
	});

	test('printing shows the worksheet and its key only', async ({ page }) => {
		await page.goto('/lab');
		await page.emulateMedia({ media: 'print' });
		await expect(page.getByTestId('worksheet')).toBeVisible();
		await expect(page.getByTestId('worksheet-key')).toBeVisible();
		await expect(page.getByTestId('converter-kelvin')).toBeHidden();
		await expect(page.getByRole('link', { name: 'Chromaslate home' })).toBeHidden();
		await expect(page.getByTestId('worksheet-new')).toBeHidden();
	});

	test('has no serious accessibility problems', async ({ page }) => {
		await page.goto('/lab');
		// The lab's own content; the shared header and footer are checked with the shell.
		const result = await new AxeBuilder({ page }).include('main').analyze();
		const serious = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
		expect(serious.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
	});

	for (const width of [360, 1440]) {
		test(`fits a ${width} px wide screen (screenshot for review)`, async ({ page }) => {
			await page.setViewportSize({ width, height: 900 });
			await page.goto('/lab');
			await page.evaluate(() => document.fonts.ready);
			// Nothing wider than the screen: no sideways scrolling of the page.
			const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
			expect(overflow).toBeLessThanOrEqual(0);
			// The chart's text stays readable: the rendered tick labels are at least 9 px tall.
			const fontPx = await page.locator('svg[data-zoom] text').first().evaluate((el) => el.getBoundingClientRect().height);
			expect(fontPx).toBeGreaterThanOrEqual(9);
			mkdirSync(SHOTS, { recursive: true });
			await page.screenshot({ path: join(SHOTS, `lab-${width}.png`), fullPage: true });
		});
	}

	test('the chart timing page does not exist in the built app', async ({ page }) => {
		const res = await page.goto('/dev/chart-bench');
		expect(res?.status()).toBe(404);
	});
});
