/**
 * An accessibility pass with axe-core over the main pages, signed out and signed in as the demo
 * gaffer: no serious or critical violations (WCAG 2.x A and AA rules).
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { openDemoProject, signIn } from './helpers/session';

async function audit(page: Page, name: string) {
	await page.waitForLoadState('networkidle').catch(() => {});
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	const summary = bad.map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
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

test.describe('signed in as the gaffer', () => {
	let base = '';
	let setupId: number | null = null;
	test.beforeEach(async ({ page }) => {
		await signIn(page, 'gaffer');
		base = await openDemoProject(page);
		const res = await page.request.get(`/api/v1${base}/setups`);
		const items = res.ok() ? ((await res.json()).items as { id: number; light_count: number }[]) : [];
		setupId = (items.find((s) => s.light_count > 0) ?? items[0])?.id ?? null;
	});

	test('axe: project page', async ({ page }) => {
		await page.goto(base);
		await audit(page, 'project page');
	});

	test('axe: setup page', async ({ page }) => {
		test.skip(setupId === null, 'the demo has no setup');
		await page.goto(`${base}/setups/${setupId}`);
		await audit(page, 'setup page');
	});

	test('axe: setup bench, with a light selected', async ({ page }) => {
		test.skip(setupId === null, 'the demo has no setup');
		await page.goto(`${base}/setups/${setupId}/bench`);
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
