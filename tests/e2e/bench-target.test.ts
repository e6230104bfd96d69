/**
 * Choosing the target white on the setup bench, as the DP does on a phone: from a reading of the
 * setup (the house tubes, so the key matches the room), then a CIE illuminant; a bad tolerance is
 * refused next to its field. Works on a setup of its own (invented, demo data) so the demo's
 * targets stay as they are for the other tests.
 */
import { expect, test, type APIRequestContext } from '@playwright/test';
import { openDemoProject, screenshot, signIn } from './helpers/session';

async function ok<T>(res: Awaited<ReturnType<APIRequestContext['post']>>): Promise<T> {
	expect(res.ok(), `${res.url()} answered ${res.status()}: ${await res.text()}`).toBe(true);
	return (await res.json()) as T;
}

test('the DP picks the target on a phone: a reading of the setup, then a CIE illuminant; a bad tolerance is refused', async ({ page }) => {
	test.setTimeout(60_000);
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'dp');
	const base = await openDemoProject(page);
	const api = `/api/v1${base}`;
	const day = await ok<{ id: number }>(await page.request.post(`${api}/days`, { data: { date: '2026-12-04', label: 'Target test night', locationName: 'Corridor set (invented)', mainsVoltage: 230, mainsFrequency: 50 } }));
	const setup = await ok<{ id: number }>(await page.request.post(`${api}/setups`, { data: { shootDayId: day.id, name: 'Target test corridor', status: 'planning' } }));
	for (const l of [
		{ label: 'Corridor tubes', role: 'ambient', kind: 'fluorescent', cct_k: 4100, duv: 0.006 },
		{ label: 'Tungsten key', role: 'key', kind: 'tungsten', cct_k: 3200, duv: 0 }
	]) {
		const light = await ok<{ id: number }>(await page.request.post(`${api}/lights`, { data: { setupId: setup.id, label: l.label, role: l.role, kind: l.kind } }));
		await ok(await page.request.post(`${api}/readings`, { data: { label: `${l.label} as found`, raw: { kind: 'cct_duv', cct_k: l.cct_k, duv: l.duv }, setupId: setup.id, lightId: light.id } }));
	}

	await page.goto(`${base}/setups/${setup.id}/bench`);
	await expect(page.getByTestId('bench')).toHaveAttribute('data-hydrated', 'true');
	const panel = page.getByTestId('bench-target');
	await expect(panel.getByTestId('bench-no-target')).toBeVisible();
	await expect(page.getByTestId('bench-xy-chart-target')).toHaveCount(0);

	// The house tubes as the target.
	await panel.getByText('Choose the target').click();
	await panel.getByLabel('A reading of this setup').check();
	const readingSelect = panel.locator('select[name="readingId"]');
	const tubes = readingSelect.locator('option', { hasText: 'Corridor tubes as found' });
	await expect(tubes).toHaveText(/4,100\sK/);
	await readingSelect.selectOption((await tubes.getAttribute('value'))!);
	await panel.getByTestId('bench-set-target').click();
	await expect(panel.getByRole('status')).toHaveText('Target set.');
	await expect(panel.getByTestId('bench-target-cct')).toContainText('4,100 K');
	await expect(panel.getByTestId('bench-target-cct')).toContainText('+0.0060');
	await expect(page.getByTestId('bench-xy-chart-target')).toHaveCount(1);
	// The tubes are now on target and the tungsten key is the light to fix.
	const lights = page.getByTestId('bench-light');
	await expect(lights.first()).toContainText('Corridor tubes');
	await screenshot(page, 'bench-target-reading', 360);

	// A tolerance that is not a number is refused next to its field, and nothing changes.
	await panel.getByText('Choose another target').click();
	await panel.getByLabel('CIE illuminant').check();
	await panel.locator('select[name="name"]').selectOption('D50');
	await panel.getByLabel('Tolerance (Δu′v′)').fill('lots');
	await panel.getByTestId('bench-set-target').click();
	await expect(panel.getByRole('status')).not.toHaveText('Target set.');
	await expect(panel.getByTestId('bench-target-cct')).toContainText('4,100 K');

	// CIE D50: x, y = 0.3457, 0.3585 (CIE 15:2004 Table T.3), CCT about 5003 K (from memory).
	await panel.getByLabel('Tolerance (Δu′v′)').fill('0.003');
	await panel.getByTestId('bench-set-target').click();
	await expect(panel.getByRole('status')).toHaveText('Target set.');
	await expect(panel.getByTestId('bench-target-cct')).toContainText(/5,00[23]\sK/);
	await expect(panel).toContainText('0.003');
	await screenshot(page, 'bench-target-illuminant', 360);
});
