/**
 * An accessibility pass with axe-core over the main pages, signed out and signed in as the demo
 * DP (who may also set the target, so the bench shows every control): no serious or critical violations (WCAG 2.x A and AA rules).
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { openDemoProject, signIn } from './helpers/session';

/** A setup with measured lights to audit: the demo's, or a small invented one made through the API (demo data). */
async function someSetup(page: Page, base: string): Promise<number> {
	const api = `/api/v1${base}`;
	const items = ((await (await page.request.get(`${api}/setups`)).json()).items ?? []) as { id: number; light_count: number }[];
	const found = items.find((s) => s.light_count > 0);
	if (found) return found.id;
	const day = await (await page.request.post(`${api}/days`, { data: { date: '2026-12-04', label: 'Audit night', locationName: 'Test stage (invented)', mainsVoltage: 230, mainsFrequency: 50 } })).json();
	const setup = await (await page.request.post(`${api}/setups`, { data: { shootDayId: day.id, name: 'Audit wide', status: 'planning' } })).json();
	for (const [label, kind, cct_k] of [['Audit key', 'tungsten', 3200], ['Audit fill', 'led-rgbw', 5600]] as const) {
		const light = await (await page.request.post(`${api}/lights`, { data: { setupId: setup.id, label, kind, role: 'key' } })).json();
		const r = await page.request.post(`${api}/readings`, { data: { label: `${label} as found`, raw: { kind: 'cct_duv', cct_k, duv: 0 }, setupId: setup.id, lightId: light.id } });
		expect(r.status()).toBe(201);
	}
	const current = await (await page.request.get(`${api}/setups/${setup.id}`)).json();
	const t = await page.request.put(`${api}/setups/${setup.id}/target`, { data: { target: { kind: 'cct_duv', cct_k: 4300, duv: 0 }, tolerance: 0.002, version: current.version } });
	expect(t.status()).toBe(200);
	return setup.id;
}

async function audit(page: Page, name: string) {
	await page.waitForLoadState('networkidle').catch(() => {});
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	const node = (n: (typeof bad)[number]['nodes'][number]) => {
		const c = n.any.find((a) => a.id === 'color-contrast')?.data as { fgColor?: string; bgColor?: string; contrastRatio?: number } | undefined;
		return `${n.target.join(' ')}${c?.contrastRatio ? ` (${c.fgColor} on ${c.bgColor}: ${c.contrastRatio}:1)` : ''}`;
	};
	const summary = bad.map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 4).map(node).join(' | ')}`);
	expect(summary, `${name}: serious or critical accessibility violations`).toEqual([]);
}

for (const [name, path] of [
	['landing page', '/'],
	['mired lab', '/lab'],
	['set tools', '/tools'],
	['sign-in', '/sign-in']
] as const) {
	test(`axe: ${name}`, async ({ page }) => {
		await page.goto(path);
		await audit(page, name);
	});
}

test.describe('signed in as the DP', () => {
	let base = '';
	let setupId = 0;
	test.beforeEach(async ({ page }) => {
		await signIn(page, 'dp');
		base = await openDemoProject(page);
		setupId = await someSetup(page, base);
	});

	test('axe: project page', async ({ page }) => {
		await page.goto(base);
		await audit(page, 'project page');
	});

	test('axe: setup page', async ({ page }) => {
		await page.goto(`${base}/setups/${setupId}`);
		await audit(page, 'setup page');
	});

	test('axe: setup bench, with a light selected', async ({ page }) => {
		await page.goto(`${base}/setups/${setupId}/bench`);
		await expect(page.getByTestId('bench')).toHaveAttribute('data-hydrated', 'true');
		await audit(page, 'setup bench');
		const first = page.getByTestId('bench-light').first();
		if (await first.count()) {
			await first.click();
			await expect(page.getByTestId('fix-panel')).toBeVisible();
			await page.getByTestId('gel-fix').first().or(page.getByRole('alert').first()).waitFor({ timeout: 20_000 }).catch(() => {});
			await audit(page, 'setup bench with fixes');
		}
	});
});
