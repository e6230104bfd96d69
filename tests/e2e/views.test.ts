/**
 * The views in a browser, on the seeded demo (invented data): the demo gaffer opens a reading from
 * the readings list (chart position, spectrum with its references, CRI bars, swatch, numbers), a
 * chromaticity-only reading that says plainly it has no spectrum, and the setup bench with a light's
 * spectrum through a gel stack. Screenshots at 360 and 1440 px; axe finds no serious or critical issue.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { openDemoProject, screenshot, signIn } from './helpers/session';

async function audit(page: Page, name: string) {
	await page.waitForLoadState('networkidle').catch(() => {});
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	expect(
		bad.map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 4).map((n) => n.target.join(' ')).join(' | ')}`),
		`${name}: serious or critical accessibility violations`
	).toEqual([]);
}

async function json<T>(page: Page, url: string): Promise<T> {
	const res = await page.request.get(url);
	expect(res.ok(), `${url} answered ${res.status()}`).toBe(true);
	return (await res.json()) as T;
}

test('the gaffer opens a measured reading: chart, spectrum against its references, CRI bars, swatch and numbers', async ({ page }) => {
	test.setTimeout(60_000);
	await signIn(page, 'gaffer');
	const base = await openDemoProject(page);
	await page.goto(`${base}/readings?sort=label&order=asc`);
	// The demo's tube reading: a measured spectrum (invented model).
	const link = page.getByTestId('reading-link').filter({ hasText: 'Tubes over the counter' }).first();
	await expect(link).toBeVisible();
	await link.click();
	await expect(page.getByTestId('reading-label')).toHaveText('Tubes over the counter');

	await expect(page.getByTestId('reading-xy-chart').getByTestId('reading-xy-chart-point')).toHaveCount(1);
	await expect(page.getByTestId('reading-swatch')).toBeVisible();
	await expect(page.getByTestId('numbers-table-cct')).toContainText('K');
	// The reading, its CRI reference and the setup's target white.
	const plot = page.getByTestId('reading-spectrum');
	await expect(plot.getByTestId('reading-spectrum-line')).toHaveCount(3);
	await expect(plot.getByTestId('reading-spectrum-key')).toContainText('CRI reference');
	await expect(page.getByTestId('reading-cri').getByTestId('reading-cri-bar')).toHaveCount(16);

	// Keyboard: tab to the wavelength cursor and step along the spectrum.
	const slider = plot.getByRole('slider');
	await slider.focus();
	await page.keyboard.press('Home');
	await page.keyboard.press('ArrowRight');
	await expect(slider).toHaveAttribute('aria-valuenow', '385');
	await expect(plot.getByTestId('reading-spectrum-readout')).toContainText('385 nm');

	await screenshot(page, 'reading', 1440);
	await audit(page, 'reading page');
	await screenshot(page, 'reading', 360);
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
	expect(overflow).toBeLessThanOrEqual(1);
	await audit(page, 'reading page (phone)');

	// The light theme (the colorist's desk) passes too.
	await page.setViewportSize({ width: 1440, height: 900 });
	await page.evaluate(() => document.documentElement.setAttribute('data-theme', 'light'));
	await screenshot(page, 'reading-light-theme', 1440);
	await audit(page, 'reading page, light theme');
});

test('a chromaticity-only reading says there is no spectrum or CRI instead of empty charts', async ({ page }) => {
	await signIn(page, 'gaffer');
	const base = await openDemoProject(page);
	const projectId = base.split('/').pop();
	const res = await page.request.post(`/api/v1/projects/${projectId}/readings`, { data: { label: 'Typed by hand (test)', raw: { kind: 'cct_duv', cct_k: 4300, duv: 0.004 } } });
	expect(res.status()).toBe(201);
	const { id } = (await res.json()) as { id: number };
	await page.goto(`${base}/readings/${id}`);
	await expect(page.getByTestId('reading-spectrum-empty')).toContainText('No spectrum');
	await expect(page.getByTestId('reading-cri-empty')).toContainText('No CRI');
	await expect(page.getByTestId('numbers-table-ra')).toContainText('needs a spectrum');
	await expect(page.getByTestId('reading-xy-chart-point')).toHaveCount(1);
	await screenshot(page, 'reading-typed', 360);
	await audit(page, 'chromaticity-only reading');
});

test('the bench shows the selected light’s spectrum against the target through a gel stack', async ({ page }) => {
	test.setTimeout(90_000);
	await signIn(page, 'gaffer');
	const base = await openDemoProject(page);
	const projectId = base.split('/').pop();
	const api = `/api/v1/projects/${projectId}`;
	// A demo setup with a target, and its light farthest from it whose last reading is a measured spectrum.
	const { items } = await json<{ items: { id: number; name: string; target: unknown }[] }>(page, `${api}/setups`);
	let pick: { setupId: number; label: string; off: number } | null = null;
	for (const s of items.filter((x) => x.target)) {
		const snap = await json<{ lights: { label: string; kind: string; lastReading: { id: number; distance: { duv_prime: number } | null } | null }[] }>(page, `${api}/setups/${s.id}/bench`);
		for (const l of snap.lights) {
			// Sodium is nearly one line: no gel brings it near a white (common practice), so it makes a poor example.
			if (!l.lastReading || l.kind === 'sodium') continue;
			const r = await json<{ raw: { kind: string } }>(page, `${api}/readings/${l.lastReading.id}`);
			const off = l.lastReading.distance?.duv_prime ?? 0;
			if (r.raw.kind === 'spectral' && (!pick || off > pick.off)) pick = { setupId: s.id, label: l.label, off };
		}
		if (pick && pick.off > 0.004) break;
	}
	expect(pick, 'the demo has a setup with a target and a measured light').not.toBeNull();

	await page.setViewportSize({ width: 1440, height: 900 });
	await page.goto(`${base}/setups/${pick!.setupId}/bench`);
	await expect(page.getByTestId('bench')).toHaveAttribute('data-hydrated', 'true');
	await page.getByTestId('bench-light').filter({ hasText: pick!.label }).first().click();
	await expect(page.getByTestId('gel-fix').first()).toBeVisible({ timeout: 20_000 });
	const spectrum = page.getByTestId('bench-spectrum');
	await expect(spectrum.getByTestId('bench-spectrum-plot-transmission')).toHaveCount(1, { timeout: 20_000 });
	await expect(spectrum.locator('[data-role="reading"]')).toHaveCount(1);
	await expect(spectrum.locator('[data-role="predicted"]')).toHaveCount(1);
	await expect(spectrum.locator('[data-role="target"]')).toHaveCount(1);
	await expect(spectrum.getByTestId('bench-spectrum-plot-ttick').last()).toHaveText('100 %');

	// The light as measured, without a gel: no transmission, no prediction.
	await spectrum.getByTestId('bench-spectrum-stack').selectOption('');
	await expect(spectrum.getByTestId('bench-spectrum-plot-transmission')).toHaveCount(0);
	await spectrum.getByTestId('bench-spectrum-stack').selectOption({ index: 1 });
	await expect(spectrum.getByTestId('bench-spectrum-plot-transmission')).toHaveCount(1);

	await spectrum.scrollIntoViewIfNeeded();
	await screenshot(page, 'bench-spectrum', 1440);
	await audit(page, 'bench with spectrum');
	await screenshot(page, 'bench-spectrum', 360);
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
	expect(overflow).toBeLessThanOrEqual(1);
	await audit(page, 'bench with spectrum (phone)');
});
