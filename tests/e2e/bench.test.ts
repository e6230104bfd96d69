/**
 * The setup bench in a browser: the demo gaffer opens a setup's bench, sees every light on the chart
 * against the target white, selects a light, gets gel and LED fixes, accepts one and sees it
 * recorded; a reading added by someone else shows up without a reload. Screenshots at 360 and 1440 px.
 *
 * When the demo has no setup with a target and measured lights, the test builds one through the API
 * (invented: a tungsten key, an RGBW fill and a fluorescent practical, target 4000 K; demo data).
 */
import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { openDemoProject, screenshot, signIn } from './helpers/session';

interface SetupRow {
	id: number;
	target: unknown;
	light_count: number;
	locked_at: string | null;
	version: number;
}

async function ok<T>(res: Awaited<ReturnType<APIRequestContext['get']>>): Promise<T> {
	expect(res.ok(), `${res.url()} answered ${res.status()}: ${await res.text()}`).toBe(true);
	return (await res.json()) as T;
}

/** A demo setup with a target and at least two measured lights, or one built for the test. */
async function benchSetup(browser: Browser, page: Page, projectId: string): Promise<number> {
	const api = `/api/v1/projects/${projectId}`;
	const { items } = await ok<{ items: SetupRow[] }>(await page.request.get(`${api}/setups`));
	for (const s of items.filter((x) => x.target && x.light_count >= 2 && !x.locked_at)) {
		const snap = await ok<{ lights: { lastReading: unknown }[] }>(await page.request.get(`${api}/setups/${s.id}/bench`));
		if (snap.lights.filter((l) => l.lastReading).length >= 2) return s.id;
	}
	const day = await ok<{ id: number }>(await page.request.post(`${api}/days`, { data: { date: '2026-12-03', label: 'Bench test night', locationName: 'Test stage (invented)', mainsVoltage: 230, mainsFrequency: 50 } }));
	const setup = await ok<{ id: number }>(await page.request.post(`${api}/setups`, { data: { shootDayId: day.id, name: 'Bench test wide', status: 'planning' } }));
	const lights = [
		{ label: 'Tungsten key', role: 'key', kind: 'tungsten', cct_k: 3200, duv: 0 },
		{ label: 'RGBW fill', role: 'fill', kind: 'led-rgbw', cct_k: 5600, duv: 0.002 },
		{ label: 'Tube practical', role: 'practical', kind: 'fluorescent', cct_k: 4100, duv: 0.006 }
	];
	for (const l of lights) {
		const light = await ok<{ id: number }>(await page.request.post(`${api}/lights`, { data: { setupId: setup.id, label: l.label, role: l.role, kind: l.kind } }));
		await ok(await page.request.post(`${api}/readings`, { data: { label: `${l.label} as found`, raw: { kind: 'cct_duv', cct_k: l.cct_k, duv: l.duv }, setupId: setup.id, lightId: light.id } }));
	}
	// Setting the target is for the DP.
	const dp = await browser.newContext();
	const dpPage = await dp.newPage();
	await signIn(dpPage, 'dp');
	const current = await ok<SetupRow>(await dpPage.request.get(`${api}/setups/${setup.id}`));
	await ok(await dpPage.request.put(`${api}/setups/${setup.id}/target`, { data: { target: { kind: 'cct_duv', cct_k: 4000, duv: 0 }, tolerance: 0.002, version: current.version } }));
	await dp.close();
	return setup.id;
}

test('the gaffer reads the bench, gets gel and LED fixes, accepts one and sees it recorded', async ({ page, browser }) => {
	test.setTimeout(90_000);
	await signIn(page, 'gaffer');
	const base = await openDemoProject(page);
	const projectId = base.split('/').pop()!;
	const setupId = await benchSetup(browser, page, projectId);

	await page.goto(`${base}/setups/${setupId}`);
	await page.getByTestId('open-bench').click();
	await expect(page).toHaveURL(new RegExp(`/setups/${setupId}/bench$`));
	await expect(page.getByTestId('bench')).toHaveAttribute('data-hydrated', 'true');

	// Every light with a reading is on the chart, against the target and its tolerance.
	const snap = await ok<{ lights: { id: number; label: string; lastReading: unknown; led: boolean }[]; target: { CCT: number } }>(await page.request.get(`/api/v1/projects/${projectId}/setups/${setupId}/bench`));
	const measured = snap.lights.filter((l) => l.lastReading);
	const chart = page.getByTestId('bench-xy-chart');
	await expect(chart.getByTestId('bench-xy-chart-point')).toHaveCount(measured.length);
	await expect(chart.getByTestId('bench-xy-chart-target')).toHaveCount(1);
	await expect(chart.getByTestId('bench-xy-chart-tolerance')).toHaveCount(1);
	await expect(page.getByTestId('bench-target-cct')).toContainText('K');
	await expect(page.getByTestId('bench-light')).toHaveCount(snap.lights.length);
	await expect(page.getByTestId('bench-live')).toContainText('updated');

	// Select the light farthest from the target: gel fixes, then LED fixes on the other tab or column.
	await page.setViewportSize({ width: 1440, height: 900 });
	const lights = page.getByTestId('bench-light');
	const off = page.getByTestId('bench-light').filter({ has: page.locator('[data-within="false"]') });
	const target = (await off.count()) ? off.last() : lights.last();
	const label = (await target.locator('.font-semibold').first().textContent())!.trim();
	await target.click();
	await expect(target).toHaveAttribute('aria-pressed', 'true');
	const panel = page.getByTestId('fix-panel');
	await expect(panel).toContainText(`Fixes for ${label}`);
	await expect(panel.getByTestId('gel-fix').first()).toBeVisible({ timeout: 20_000 });
	await expect(panel.getByTestId('gel-fix').first().getByTestId('gel-residual')).toContainText('Δu′v′');
	// LED fixes: the light's own profile, or a generic one picked from the options.
	const ledCard = panel.getByTestId('led-fix');
	if (!(await ledCard.isVisible().catch(() => false))) {
		await expect(panel.getByTestId('led-error').or(ledCard)).toBeVisible({ timeout: 20_000 });
		if (await panel.getByTestId('led-error').isVisible()) {
			await panel.getByTestId('fixture').selectOption('generic-rgbw');
			await panel.getByTestId('led-fixes').getByRole('button', { name: 'Work out again' }).click();
		}
	}
	await expect(ledCard).toBeVisible({ timeout: 20_000 });
	await expect(ledCard.getByTestId('led-channel')).toHaveCount(4);
	await expect(ledCard.getByTestId('led-channels')).toContainText('/');
	// Arrows from now to each shown fix's prediction are on the chart.
	await expect(chart.getByTestId('bench-xy-chart-arrow').first()).toBeAttached();
	await screenshot(page, 'bench', 1440);

	// Accept the best gel fix: it is recorded with who and when, and shown on the light.
	const best = panel.getByTestId('gel-fix').first();
	const stack = (await best.getByTestId('gel-fix-label').textContent())!.trim();
	await best.getByTestId('accept-gel').click();
	await expect(panel.getByTestId('fix-recorded')).toContainText('Gel fix recorded');
	await expect(page.getByTestId('bench-light').filter({ hasText: label }).getByTestId('bench-accepted')).toContainText(stack === 'no filter' ? 'no gel' : stack.split(' + ')[0]);
	const lightId = Number(await page.getByTestId('bench-light').filter({ hasText: label }).getAttribute('data-light-id'));
	const accepted = await ok<{ items: { kind: string; accepted_by_name: string; accepted_at: string }[] }>(await page.request.get(`/api/v1/projects/${projectId}/lights/${lightId}/fixes`));
	expect(accepted.items[0].kind).toBe('gel');
	expect(accepted.items[0].accepted_by_name).toBeTruthy();

	// Another crew member adds a reading: the bench picks it up by itself.
	const before = await page.getByTestId('bench-light').filter({ hasText: label }).textContent();
	await ok(await page.request.post(`/api/v1/projects/${projectId}/readings`, { data: { label: 'Checked after the fix', raw: { kind: 'cct_duv', cct_k: snap.target.CCT, duv: 0 }, setupId, lightId } }));
	await expect(page.getByTestId('bench-light').filter({ hasText: label })).toContainText('Checked after the fix', { timeout: 15_000 });
	expect(before).not.toContain('Checked after the fix');
	await expect(page.getByTestId('bench-live')).toContainText('New readings');

	// Phone: chart full width, lists below, fixes as tabs.
	await page.setViewportSize({ width: 360, height: 780 });
	await expect(panel.getByRole('tab', { name: 'LED fixes' })).toBeVisible();
	await panel.getByRole('tab', { name: 'LED fixes' }).click();
	await expect(ledCard).toBeVisible({ timeout: 20_000 });
	await panel.getByRole('tab', { name: 'Gel fixes' }).click();
	await screenshot(page, 'bench', 360);
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
	expect(overflow).toBeLessThanOrEqual(1);
});

test('a viewer sees the bench but no Accept and no fix requests', async ({ page }) => {
	await signIn(page, 'viewer');
	const base = await openDemoProject(page);
	const projectId = base.split('/').pop()!;
	const { items } = await ok<{ items: SetupRow[] }>(await page.request.get(`/api/v1/projects/${projectId}/setups`));
	test.skip(items.length === 0, 'the demo has no setup yet');
	await page.goto(`${base}/setups/${items[0].id}/bench`);
	await expect(page.getByTestId('bench')).toHaveAttribute('data-hydrated', 'true');
	const first = page.getByTestId('bench-light').first();
	if (await first.count()) {
		await first.click();
		await expect(page.getByTestId('fix-panel')).toBeVisible();
		await expect(page.getByRole('button', { name: /^Accept this/ })).toHaveCount(0);
	}
	await expect(page.getByTestId('bench-set-target')).toHaveCount(0);
});
