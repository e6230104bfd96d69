/**
 * Every screen fits a 360 px phone: nothing runs off the side (wide tables scroll inside their own
 * box). Signed in as the demo owner, who sees every page of the demo project.
 */
import { expect, test, type APIRequestContext } from '@playwright/test';
import { gotoReady, openDemoProject, signIn } from './helpers/session';

async function json<T>(request: APIRequestContext, url: string): Promise<T> {
	const res = await request.get(url);
	expect(res.ok(), `${url} answered ${res.status()}`).toBe(true);
	return (await res.json()) as T;
}

test('no screen is wider than a 360 px phone', async ({ page }) => {
	test.setTimeout(120_000);
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'owner');
	const base = await openDemoProject(page);
	const api = `/api/v1${base}`;
	const { items: setups } = await json<{ items: { id: number; shoot_day_id: number }[] }>(page.request, `${api}/setups`);
	const { items: lights } = await json<{ items: { id: number; setup_id: number }[] }>(page.request, `${api}/lights?setup=${setups[0].id}`);
	const { items: readings } = await json<{ items: { id: number }[] }>(page.request, `${api}/readings`);
	const paths = [
		'/', '/lab', '/tools', '/library', '/projects', '/account',
		base, `${base}/settings`, `${base}/members`, `${base}/days`, `${base}/days/${setups[0].shoot_day_id}`,
		`${base}/setups/${setups[0].id}`, `${base}/setups/${setups[0].id}/bench`, `${base}/setups/${setups[0].id}/lights/${lights[0].id}`,
		`${base}/readings`, `${base}/readings/${readings[0].id}`, `${base}/readings/new`, `${base}/readings/upload`,
		`${base}/review`, `${base}/activity`, `${base}/export`, `${base}/photos`, `${base}/library`
	];
	const tooWide: string[] = [];
	for (const path of paths) {
		await gotoReady(page, path);
		const width = await page.evaluate(() => document.documentElement.scrollWidth);
		if (width > 360) tooWide.push(`${path}: ${width} px`);
	}
	expect(tooWide).toEqual([]);
});
