/**
 * The library in the browser. The shared library is public (readable signed out, like the mired
 * lab: it holds no project's data); changing it needs a site admin, and a project's library needs
 * sign-in and a place on the project.
 */
import { expect, test, type Page } from '@playwright/test';
import { openDemoProject, screenshot, signIn } from './helpers/session';

/** Links, buttons, selects and text fields in the page body are at least a thumb high (links inside a sentence excepted). */
async function smallTargets(page: Page): Promise<string[]> {
	return page
		.locator('main a, main button, main select, main input[type="text"], main input:not([type])')
		.evaluateAll((els) =>
			els
				.filter((el) => (el as HTMLElement).offsetParent !== null && !el.closest('p') && el.getBoundingClientRect().height < 44)
				.map((el) => el.outerHTML.slice(0, 80))
		);
}

test('signed out, /library shows every built-in filter with its figures, curve and effects, the heat caution and the generic fixtures', async ({ page }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await page.goto('/library');
	await expect(page.getByRole('heading', { name: 'Library', level: 1 })).toBeVisible();
	await expect(page.getByTestId('library-public-note')).toContainText('Open to everyone');
	await expect(page.getByTestId('filter-card')).toHaveCount(21);
	await expect(page.getByTestId('heat-caution')).toContainText('burn');

	const half = page.locator('[data-filter="ctb-half"]');
	await expect(half.getByTestId('filter-mired')).toContainText('−80 to −58 mired');
	await expect(half.getByRole('img')).toHaveAttribute('aria-label', /Transmission of ½ CTB: \d+ % at 450 nm/);
	await expect(half.getByRole('table')).toContainText('3200 K');
	await expect(half.getByRole('table')).toContainText('5600 K');
	await expect(page.getByTestId('fixture-card')).toHaveCount(4);
	// No upload forms for someone who is not a site admin.
	await expect(page.getByTestId('gel-upload-form')).toHaveCount(0);
	expect(await smallTargets(page)).toEqual([]);
	await screenshot(page, 'library', 360);
	await screenshot(page, 'library', 1440);

	// The header links here.
	await page.setViewportSize({ width: 1440, height: 900 });
	await page.goto('/');
	await page.getByRole('link', { name: 'Library', exact: true }).first().click();
	await expect(page).toHaveURL(/\/library$/);
});

test('the demo owner sets ½ CTB to −68 mired on the project library page, sees it on the filter, and puts it back', async ({ page }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'owner');
	const project = await openDemoProject(page);
	await page.goto(`${project}/library`);
	await expect(page.getByRole('heading', { name: 'Project library' })).toBeVisible();

	await page.getByTestId('override-gel').selectOption('ctb-half');
	await expect(page.getByTestId('override-builtin')).toContainText('−65.5 mired');
	await page.getByTestId('override-mired').fill('−68');
	await page.getByTestId('override-note').fill('our swatch book');
	await page.getByTestId('override-submit').click();
	await expect(page.getByTestId('override-form').getByTestId('form-alert')).toContainText('Saved');

	const row = page.locator('[data-testid="override-row"][data-filter="ctb-half"]');
	await expect(row).toContainText('−68 mired');
	await expect(row).toContainText('our swatch book');
	const card = page.locator('[data-testid="filter-card"][data-filter="ctb-half"]');
	await expect(card.getByTestId('filter-mired')).toContainText('−68 mired');
	await expect(card.getByTestId('filter-mired')).toContainText('built-in −65.5');
	expect(await smallTargets(page)).toEqual([]);
	await screenshot(page, 'project-library', 360);
	await screenshot(page, 'project-library', 1440);

	// A number the form cannot read is refused next to the field, and nothing changes.
	await page.getByTestId('override-gel').selectOption('cto-half');
	await page.getByTestId('override-mired').fill('about 80');
	await page.getByTestId('override-submit').click();
	await expect(page.getByTestId('override-form').getByTestId('form-alert')).toContainText('second look');
	await expect(page.locator('[data-testid="override-row"][data-filter="cto-half"]')).toHaveCount(0);

	await row.getByRole('button', { name: /Use built-in/ }).click();
	await expect(page.locator('[data-testid="override-row"][data-filter="ctb-half"]')).toHaveCount(0);
	await expect(card.getByTestId('filter-mired')).toContainText('−80 to −58 mired');
});

test('the demo gaffer adds a measured filter and a fixture profile from CSV files, sees them characterised, and removes them', async ({ page }) => {
	await page.setViewportSize({ width: 1440, height: 900 });
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await page.goto(`${project}/library`);
	page.on('dialog', (d) => void d.accept());
	const stamp = Date.now().toString(36);

	// A flat 50 % sheet: one stop (a factor of two) and no colour shift.
	let csv = 'wavelength_nm,Grey sample\n';
	for (let nm = 380; nm <= 780; nm += 5) csv += `${nm},50\n`;
	const gelForm = page.getByTestId('gel-upload-form');
	await gelForm.getByLabel('Name').fill(`Test grey ${stamp}`);
	await page.getByTestId('gel-file').setInputFiles({ name: 'grey.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
	await page.getByTestId('gel-submit').click();
	await expect(gelForm.getByTestId('form-alert')).toContainText(`Added “Test grey ${stamp}”`);
	await expect(gelForm.getByTestId('form-alert')).toContainText('Read as percent');
	const card = page.getByTestId('custom-gel-card').filter({ hasText: `Test grey ${stamp}` });
	await expect(card).toContainText('1.0 stop');
	await expect(card).toContainText('in %');

	// Channel spectra: the browser lists the channels and asks for each one's maximum output.
	let channels = 'wavelength_nm,Warm,Cool\n';
	for (let nm = 380; nm <= 780; nm += 5) channels += `${nm},${(Math.exp(-(((nm - 610) / 60) ** 2)) + 0.01).toFixed(5)},${(Math.exp(-(((nm - 460) / 25) ** 2)) + 0.5 * Math.exp(-(((nm - 560) / 70) ** 2))).toFixed(5)}\n`;
	const fixtureForm = page.getByTestId('fixture-upload-form');
	await fixtureForm.getByLabel('Name').fill(`Test panel ${stamp}`);
	await page.getByTestId('fixture-file').setInputFiles({ name: 'panel.csv', mimeType: 'text/csv', buffer: Buffer.from(channels) });
	const outputs = page.getByTestId('channel-outputs');
	await expect(outputs).toContainText('Warm');
	await outputs.getByLabel('Warm').fill('1');
	await outputs.getByLabel('Cool').fill('1,2');
	await page.getByTestId('fixture-submit').click();
	await expect(fixtureForm.getByTestId('form-alert')).toContainText(`Added “Test panel ${stamp}”`);
	const fixture = page.getByTestId('fixture-card').filter({ hasText: `Test panel ${stamp}` });
	await expect(fixture).toContainText('Warm');
	await expect(fixture).toContainText('45 %'); // 1 / (1 + 1.2) of the output at full
	await screenshot(page, 'project-library-uploads', 1440);

	await card.getByRole('button', { name: /Remove/ }).click();
	await expect(page.getByTestId('custom-gel-card').filter({ hasText: `Test grey ${stamp}` })).toHaveCount(0);
	await fixture.getByRole('button', { name: /Remove/ }).click();
	await expect(page.getByTestId('fixture-card').filter({ hasText: `Test panel ${stamp}` })).toHaveCount(0);
});
