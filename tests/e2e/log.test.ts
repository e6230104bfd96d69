/**
 * The lighting log in the browser, on the seeded demo (invented data): the gaffer adds a light and a
 * reading in a setup, the colorist comments on it in review and mentions the gaffer. Screenshots at
 * 360 px and 1440 px go to the test results for a look.
 */
import { expect, test, type Page } from '@playwright/test';
import { gotoReady, hydrated, openDemoProject, screenshot, signIn } from './helpers/session';

const LABEL = `Counter practical ${Date.now().toString(36)}`;

async function openSetup(page: Page, project: string, day: string, setup: string) {
	await page.goto(`${project}/days`);
	await page.getByTestId('days-table').getByRole('row').filter({ hasText: day }).getByRole('link').first().click();
	await page.getByTestId('setup-list').getByRole('link', { name: new RegExp(setup) }).click();
	await expect(page.getByTestId('setup-name')).toHaveText(setup);
}

test('the gaffer adds a light and a reading; the colorist comments on it in review', async ({ page, browser }) => {
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await page.goto(project);
	await page.getByTestId('log-links').getByRole('link', { name: 'Shoot days' }).click();
	await expect(page.getByRole('heading', { name: 'Shoot days' })).toBeVisible();
	await screenshot(page, 'log-days', 360);
	await screenshot(page, 'log-days', 1440);
	await page.setViewportSize({ width: 1280, height: 800 });

	await openSetup(page, project, 'Night 1', 'Close: at the counter');
	await expect(page.getByTestId('target-white')).toContainText('4,000');

	// A bad power figure is refused on its field and the form keeps what was typed.
	await page.getByTestId('add-light').locator('summary').click();
	await page.locator('#new-light-label').fill(LABEL);
	await page.locator('#new-light-role').selectOption('practical');
	await page.locator('#new-light-kind').selectOption('practical');
	await page.locator('#new-light-powerW').fill('sixty');
	await page.getByRole('button', { name: 'Add the light' }).click();
	await expect(page.getByText('Give the draw in watts.')).toBeVisible();
	await expect(page.locator('#new-light-label')).toHaveValue(LABEL);
	await page.locator('#new-light-powerW').fill('60');
	await page.locator('#new-light-circuitId').selectOption({ label: 'Counter socket' });
	await page.getByRole('button', { name: 'Add the light' }).click();
	await expect(page.getByText('Light added.')).toBeVisible();
	const row = page.getByTestId('light-table').getByTestId('light-row').filter({ hasText: LABEL });
	await expect(row).toContainText('60');
	await expect(page.getByTestId('power-plan')).toContainText(LABEL);

	await row.getByRole('link', { name: LABEL }).click();
	await expect(page.getByTestId('light-name')).toHaveText(LABEL);
	const typed = page.getByTestId('add-reading');
	await typed.locator('summary').click();
	await typed.getByLabel('CCT (K)').fill('2750');
	await typed.getByRole('textbox', { name: 'Duv' }).fill('0,0012');
	await typed.getByLabel('Illuminance (lx)').fill('80');
	await typed.getByRole('button', { name: 'Save the reading' }).click();
	await expect(page.getByText('Reading saved.')).toBeVisible();
	// The cleared form still offers CCT + Duv for the next reading.
	await expect(typed.getByLabel('CCT + Duv')).toBeChecked();
	await expect(typed.getByLabel('CCT (K)')).toHaveValue('');
	const reading = page.getByTestId('readings').getByTestId('reading').first();
	await expect(reading).toContainText('2,750');
	// 2750 K against the 4000 K target: well outside the tolerance.
	await expect(reading.getByTestId('distance')).toHaveAttribute('data-within', 'false');
	await screenshot(page, 'log-light', 360);
	await screenshot(page, 'log-light', 1440);

	// The colorist, at a desk, finds it in review and asks the gaffer about it.
	const desk = await browser.newContext();
	const colorist = await desk.newPage();
	await signIn(colorist, 'colorist');
	await gotoReady(colorist, `${project}/review`);
	await colorist.getByLabel('Setup', { exact: true }).selectOption({ label: 'Close: at the counter' });
	await colorist.getByRole('button', { name: 'Show' }).click();
	await expect(colorist).toHaveURL(/[?&]setup=\d+/);
	await hydrated(colorist);
	const card = colorist.getByTestId('review-light').filter({ hasText: LABEL });
	await expect(card).toContainText('2,750');
	await expect(card).toContainText('(final)');
	const lightThread = card.locator('section').filter({ hasText: 'On this light' }).last();
	await lightThread.getByRole('textbox').fill('@Demo Gaffer this lamp reads 2750 K on the counter: warm on purpose, or should it come up to the tubes?');
	await lightThread.getByRole('button', { name: 'Add comment' }).click();
	await expect(lightThread.getByTestId('comment')).toContainText('warm on purpose');
	await expect(lightThread.getByRole('status')).toContainText('Sent to Demo Gaffer');
	await screenshot(colorist, 'log-review', 360);
	await screenshot(colorist, 'log-review', 1440);
	await desk.close();

	// Back on set, the gaffer sees the comment on the light.
	await page.reload();
	await expect(page.getByTestId(/^comments-light-/).getByTestId('comment')).toContainText('warm on purpose');
	await openSetup(page, project, 'Night 1', 'Close: at the counter');
	await screenshot(page, 'log-setup', 360);
	await screenshot(page, 'log-setup', 1440);
});

test('a locked setup tells the crew who locked it and offers no edits; its power plan still shows', async ({ page }) => {
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await openSetup(page, project, 'Night 1', 'Wide: the row of machines');
	await expect(page.getByTestId('setup-locked')).toContainText('Locked by Demo DP');
	await expect(page.getByTestId('add-light')).toHaveCount(0);
	await expect(page.getByTestId('target-white')).toContainText('reading “Tubes, centre of room”');
	await expect(page.getByTestId('power-plan')).toContainText('Wall sockets by the door');
	await openSetup(page, project, 'Night 2', 'Window two-shot');
	await expect(page.getByTestId('power-plan').getByRole('alert').first()).toContainText('over the limit');
	await screenshot(page, 'log-power-warning', 360);
});

test('the colorist exports: CSV download with the documented header, and a report that prints', async ({ page }) => {
	await signIn(page, 'colorist');
	const project = await openDemoProject(page);
	await page.goto(`${project}/export`);
	const firstColumn = (await page.getByTestId('csv-columns').locator('tbody tr td').first().textContent())?.trim();
	const download = page.waitForEvent('download');
	await page.getByTestId('csv-link').click();
	const file = await download;
	expect(file.suggestedFilename()).toMatch(/lighting-log-\d{4}-\d{2}-\d{2}\.csv$/);
	const text = await (await file.createReadStream()).toArray().then((chunks) => Buffer.concat(chunks).toString('utf8'));
	expect(text.split('\r\n')[0].split(',')[0]).toBe(firstColumn);
	expect(text).toContain('Streetlight through the window');
	await screenshot(page, 'log-export', 360);

	// The colorist sends the log to the DP with a note; the DP's mail has the review link.
	await gotoReady(page, `${project}/export`);
	const share = page.getByTestId('share-log');
	const dp = share.getByLabel('Send to').locator('option', { hasText: 'director of photography' });
	await share.getByLabel('Send to').selectOption((await dp.getAttribute('value'))!);
	await share.getByLabel('Note (optional)').fill('Night 1 graded; have a look at the sign.');
	await share.getByRole('button', { name: 'Send the link' }).click();
	await expect(share.getByTestId('form-alert')).toContainText(/Sent to /);
	await page.goto(`${project}/export/report`);
	await expect(page.getByTestId('report')).toContainText('Wide: the row of machines');
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Print or save as PDF' })).toBeHidden();
	await screenshot(page, 'log-report-print', 1440);
});

test('no serious or critical accessibility problems on the log’s pages (axe, WCAG 2.1 A/AA)', async ({ page }) => {
	test.setTimeout(240_000);
	const { default: AxeBuilder } = await import('@axe-core/playwright');
	await signIn(page, 'dp');
	const project = await openDemoProject(page);
	await page.goto(`${project}/days`);
	const dayHref = await page.getByTestId('days-table').locator('tbody a').first().getAttribute('href');
	await page.goto(dayHref!);
	const setupHref = await page.getByTestId('setup-list').getByRole('link').first().getAttribute('href');
	await page.goto(setupHref!);
	const lightHref = await page.getByTestId('light-table').locator('tbody a').first().getAttribute('href');
	const pages = [`${project}/days`, dayHref!, setupHref!, lightHref!, `${project}/review`, `${project}/activity`, `${project}/export`, `${project}/export/report`];
	const problems: string[] = [];
	for (const path of pages) {
		await page.goto(path);
		const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
		for (const v of result.violations.filter((x) => x.impact === 'serious' || x.impact === 'critical')) {
			problems.push(`${path}: ${v.id} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
		}
	}
	expect(problems).toEqual([]);
});
