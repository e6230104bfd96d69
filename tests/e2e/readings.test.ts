import { expect, test } from '@playwright/test';
import { gotoReady, openDemoProject, screenshot, signIn } from './helpers/session';

// A meter export in a layout Chromaslate does not recognise by its headers: the gaffer maps it.
const UNKNOWN_LAYOUT = 'Name;Chroma X;Chroma Y\nTube over the machines;0,3805;0,3768\nTypo row;1,4;0,3\nDoorway;0,3346;0,3512\n';

test('a gaffer uploads a file, maps its columns, sees the row errors and confirms', async ({ page }) => {
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await gotoReady(page, `${project}/readings/upload`);

	await page.locator('#file').setInputFiles({ name: 'meter-export.csv', mimeType: 'text/csv', buffer: Buffer.from(UNKNOWN_LAYOUT, 'latin1') });
	await expect(page.getByTestId('detected')).toContainText('not recognised');

	// Map the three columns by hand.
	await page.getByLabel('Name', { exact: true }).selectOption('label');
	await page.getByLabel('Chroma X', { exact: true }).selectOption('x');
	await page.getByLabel('Chroma Y', { exact: true }).selectOption('y');
	await page.getByLabel('Save this layout for the project as').fill('Borrowed meter');
	await page.getByRole('button', { name: 'Save layout' }).click();
	await expect(page.getByText('Saved as “Borrowed meter”.')).toBeVisible();

	await page.getByRole('button', { name: 'Check the whole file' }).click();
	const report = page.getByTestId('upload-report');
	await expect(report).toContainText('2 readings ready');
	await expect(page.getByTestId('row-errors')).toContainText('row 2');
	await expect(page.getByTestId('row-errors')).toContainText('Chroma X = 1,4 is outside 0–1');
	await screenshot(page, 'upload-report', 360);
	await screenshot(page, 'upload-report', 1440);

	await page.getByRole('button', { name: 'Import 2 readings' }).click();
	await expect(page.getByTestId('upload-done')).toContainText('Imported 2 readings');

	await page.getByRole('link', { name: 'See the readings' }).click();
	await expect(page.getByTestId('readings-table')).toContainText('Tube over the machines');
	await expect(page.getByTestId('readings-table')).not.toContainText('Typo row');
});

test('a gaffer types a reading on a phone; a bad value is refused and the form keeps what was typed', async ({ page }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await page.goto(`${project}/readings/new`);

	await page.getByText('CCT + Duv').click();
	await page.getByLabel('CCT (K)').fill('3150');
	await page.getByRole('textbox', { name: 'Duv' }).fill('0,09');
	await page.getByLabel('Label').fill('Practical lamp by the dryer');
	await page.getByRole('button', { name: 'Save reading' }).click();
	await expect(page.getByText('Duv above 0.05 is too far from the locus')).toBeVisible();
	await expect(page.getByLabel('Label')).toHaveValue('Practical lamp by the dryer');
	await expect(page.getByLabel('CCT (K)')).toHaveValue('3150');
	await screenshot(page, 'typed-reading-error', 360);

	await page.getByRole('textbox', { name: 'Duv' }).fill('0,0031');
	await page.getByRole('button', { name: 'Save reading' }).click();
	await page.waitForURL(/readings\?added=1/);
	// On a phone the readings are cards (the wide table is for larger screens), and nothing runs off
	// the side of the screen.
	const list = page.getByTestId('readings-list');
	await expect(list).toBeVisible();
	await expect(page.getByTestId('readings-table')).toBeHidden();
	await expect(list).toContainText('Practical lamp by the dryer');
	// The stored reading was computed on the server from what was typed (3150 K in, 3150 K back).
	await expect(list).toContainText('3150');
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);
	await screenshot(page, 'readings-list', 360);
});

test('a colorist can read the readings but is not offered upload or typing', async ({ page }) => {
	await signIn(page, 'colorist');
	const project = await openDemoProject(page);
	await page.goto(`${project}/readings`);
	await expect(page.getByTestId('readings-table')).toBeVisible();
	await expect(page.getByRole('link', { name: 'Upload a file' })).toHaveCount(0);
	const res = await page.goto(`${project}/readings/upload`);
	expect(res?.status()).toBe(403);
});
