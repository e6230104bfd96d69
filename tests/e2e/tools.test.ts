/**
 * The set tools in a browser, signed out, on a phone and a laptop: the flicker-safe shutter and the
 * power budget. Expected values follow the rule the tools state (common practice): a mains-driven
 * source pulses at twice the mains frequency, and an exposure is flicker-free when it holds a whole
 * number of pulses, angle = 360 × fps × n / (2 × mains); continuous load is 80 % of the breaker.
 */
import { expect, test } from '@playwright/test';
import { gotoReady, screenshot } from './helpers/session';

test.describe('set tools', () => {
	test('24 fps on 50 Hz: only some angles are safe, 172.8° is, 180° is not; 25 fps on 50 Hz is in step', async ({ page }) => {
		await page.setViewportSize({ width: 360, height: 780 });
		await gotoReady(page, '/tools');
		const shutter = page.locator('#shutter');
		await shutter.getByRole('button', { name: '50 Hz' }).click();
		await shutter.getByRole('button', { name: '24 fps', exact: true }).click();
		await expect(page.getByTestId('flicker-verdict')).toContainText('Only some shutter angles are flicker-free');

		const angle = shutter.getByLabel('Shutter angle (degrees)');
		await angle.fill('172.8');
		await expect(page.getByTestId('shutter-check')).toContainText('Flicker-free');
		// 172.8° at 24 fps exposes 172.8 / 360 / 24 = 1/50 s: two 100 Hz pulses. 180° is 1/48 s: 2.08.
		await expect(page.getByTestId('shutter-check')).toContainText('2 whole pulses');
		await angle.fill('180');
		await expect(page.getByTestId('shutter-check')).toContainText('Flickers');
		await expect(page.getByTestId('shutter-check')).toContainText('2.08 pulses');
		await screenshot(page, 'tools-shutter', 360);

		await shutter.getByRole('button', { name: '25 fps', exact: true }).click();
		await expect(page.getByTestId('flicker-verdict')).toContainText('Any shutter angle is flicker-free');
		await expect(page.getByTestId('shutter-check')).toContainText('Flicker-free');
	});

	test('power budget: two 1 kW units on one North American 20 A circuit are over its 1,920 W continuous limit (80 % of 20 A × 120 V)', async ({ page }) => {
		await page.setViewportSize({ width: 360, height: 780 });
		await gotoReady(page, '/tools');
		const power = page.locator('#power');
		await power.getByRole('button', { name: /North America 20 A/ }).click();
		await expect(power.getByTestId('circuit-card')).toHaveCount(1);

		await power.getByLabel('Light name').fill('Open-face 1 kW');
		await power.getByLabel('Watts each').last().fill('1000');
		await power.getByLabel('Qty').last().fill('2');
		await power.getByRole('button', { name: 'Add light' }).click();
		await expect(power.getByTestId('circuit-card')).toHaveAttribute('data-level', /over/);
		await expect(power.getByTestId('circuit-warning')).toBeVisible();

		// The cautions stand whatever the numbers: shared circuits, generators, qualified people.
		await expect(power).toContainText(/qualified/i);
		await screenshot(page, 'tools-power', 360);
		await screenshot(page, 'tools', 1440);
	});
});
