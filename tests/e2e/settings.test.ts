/**
 * Project settings and account settings in the browser, as a new crew member of our own (invented)
 * would use them: sign up, start a project, rename it and write its notes (a field error first, then a
 * save that meets someone else's), then change their display name and password. Screenshots at 360
 * and 1440 px go to the test results for a look; axe finds no serious or critical problems.
 */
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Browser, type Page } from '@playwright/test';
import { linkIn, waitForMail } from '../integration/auth/helpers/mail';
import { uniqueEmail } from '../integration/auth/helpers/factories';
import { screenshot } from './helpers/session';

const STAMP = Date.now().toString(36);
const FIRST_PASSWORD = 'tube fluorescents stay on';
const NEW_PASSWORD = 'sodium through the front window';

async function audit(page: Page, name: string) {
	await page.waitForLoadState('networkidle').catch(() => {});
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	expect(bad.map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 4).map((n) => n.target.join(' ')).join(' | ')}`), `${name}: serious or critical accessibility violations`).toEqual([]);
}

/** A confirmed account of our own, signed in on `page`. */
async function newAccount(page: Page, name: string): Promise<string> {
	const email = uniqueEmail('e2e-settings');
	const since = new Date();
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill(name);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(FIRST_PASSWORD);
	await page.getByRole('button', { name: 'Make my account' }).click();
	await expect(page.getByRole('heading', { name: 'Confirm your address' })).toBeVisible();
	await page.goto(linkIn(await waitForMail(email, { subject: /Confirm your address/, since }), '/verify/'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await page.getByLabel('Password').fill(FIRST_PASSWORD);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page).toHaveURL(/\/projects$/);
	return email;
}

async function secondTab(browser: Browser, page: Page): Promise<Page> {
	const context = await browser.newContext({ storageState: await page.context().storageState() });
	return context.newPage();
}

test('the owner renames the project and writes its notes; a save that meets another one shows both', async ({ page, browser }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await newAccount(page, 'Settings Owner');
	const name = `Laundromat nights ${STAMP} (invented)`;
	await page.getByRole('link', { name: 'New project' }).click();
	await page.getByLabel('Name').fill(name);
	await page.getByRole('button', { name: 'Create the project' }).click();
	await expect(page.getByTestId('project-name')).toHaveText(name);

	await page.getByTestId('settings-link').click();
	await expect(page.getByRole('heading', { name: 'Project settings' })).toBeVisible();
	await expect(page.getByLabel('Name')).toHaveValue(name);
	await screenshot(page, 'project-settings', 360);
	await audit(page, 'project settings');

	// An empty name is refused on its field; the notes typed stay.
	await page.getByLabel('Name').fill('   ');
	await page.getByLabel('Notes').fill('Invented: two nights in a laundromat, then a studio day.');
	await page.getByRole('button', { name: 'Save the settings' }).click();
	await expect(page.getByTestId('field-error')).toContainText('Give the project a name.');
	await expect(page.getByLabel('Name')).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByLabel('Notes')).toHaveValue('Invented: two nights in a laundromat, then a studio day.');
	await screenshot(page, 'project-settings-error', 360);

	const renamed = `${name} – reshoot`;
	await page.getByLabel('Name').fill(renamed);
	await page.getByRole('button', { name: 'Save the settings' }).click();
	await expect(page.getByTestId('form-alert')).toContainText('Saved.');
	await expect(page.getByTestId('back-to-project')).toContainText(renamed);

	// Someone else (here: the same owner in another window, opened before this save) saves over it.
	const other = await secondTab(browser, page);
	await other.setViewportSize({ width: 1440, height: 900 });
	await other.goto(page.url());
	await expect(other.getByLabel('Name')).toHaveValue(renamed);
	await screenshot(other, 'project-settings', 1440);
	await page.getByLabel('Notes').fill('Invented: the studio day moved to Friday.');
	await page.getByRole('button', { name: 'Save the settings' }).click();
	await expect(page.getByTestId('form-alert')).toContainText('Saved.');
	await other.getByLabel('Notes').fill('Invented: bring the ladder for the sign.');
	await other.getByRole('button', { name: 'Save the settings' }).click();
	const conflict = other.getByTestId('conflict');
	await expect(conflict).toContainText('Settings Owner saved a change first');
	await expect(conflict).toContainText('Invented: bring the ladder for the sign.');
	await expect(conflict).toContainText('Invented: the studio day moved to Friday.');
	await expect(other.getByLabel('Notes')).toHaveValue('Invented: bring the ladder for the sign.');
	await screenshot(other, 'project-settings-conflict', 1440);
	await audit(other, 'project settings with a conflict');
	// Saving again keeps theirs over what was stored.
	await other.getByRole('button', { name: 'Save the settings' }).click();
	await expect(other.getByTestId('form-alert')).toContainText('Saved.');
	await other.context().close();

	await page.getByTestId('back-to-project').click();
	await expect(page.getByTestId('project-name')).toHaveText(renamed);
	await expect(page.getByTestId('project-notes')).toHaveText('Invented: bring the ladder for the sign.');
	await screenshot(page, 'project-settings-done', 360);
	await page.goto(`${new URL(page.url()).pathname}/activity?type=project`);
	await expect(page.getByTestId('activity-table')).toContainText(`Renamed the project “${name}” to “${renamed}”`);
	await screenshot(page, 'project-activity', 1440);
});

test('account settings: change the display name and the password, see your projects and roles', async ({ page }) => {
	const email = await newAccount(page, 'Night Electric');
	await page.getByRole('link', { name: 'New project' }).click();
	const name = `Studio day ${STAMP} (invented)`;
	await page.getByLabel('Name').fill(name);
	await page.getByRole('button', { name: 'Create the project' }).click();
	await expect(page.getByTestId('project-name')).toHaveText(name);

	await page.setViewportSize({ width: 360, height: 780 });
	await page.getByTestId('header-account-link').click();
	await expect(page.getByRole('heading', { name: 'Your account' })).toBeVisible();
	await expect(page.getByTestId('account-email')).toHaveText(email);
	await expect(page.getByTestId('account-project').filter({ hasText: name })).toContainText('Owner');
	await screenshot(page, 'account', 360);
	await audit(page, 'account page');

	// Every control in the page body is at least a thumb high.
	const small = await page.locator('main a, main button, main input:not([type=hidden]), main select').evaluateAll((els) =>
		els.filter((el) => (el as HTMLElement).offsetParent !== null && el.getBoundingClientRect().height < 44).map((el) => el.outerHTML.slice(0, 80))
	);
	expect(small).toEqual([]);

	await page.getByLabel('Display name').fill('');
	await page.getByRole('button', { name: 'Save the name' }).click();
	await expect(page.getByTestId('name-form').getByTestId('field-error')).toContainText('Enter your name');
	await page.getByLabel('Display name').fill('Rigging Electric');
	await page.getByRole('button', { name: 'Save the name' }).click();
	await expect(page.getByTestId('form-alert')).toContainText('The crew now sees you as Rigging Electric.');

	// A wrong current password is refused on its field and nothing is kept in the boxes.
	await page.getByLabel('Current password').fill('not my password at all');
	await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
	await page.getByLabel('New password again').fill(NEW_PASSWORD);
	await page.getByRole('button', { name: 'Change the password' }).click();
	await expect(page.getByTestId('password-form').getByTestId('field-error')).toContainText('That is not your current password.');
	await expect(page.getByLabel('New password', { exact: true })).toHaveValue('');
	await screenshot(page, 'account-password-error', 360);

	await page.getByLabel('Current password').fill(FIRST_PASSWORD);
	await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
	await page.getByLabel('New password again').fill(NEW_PASSWORD);
	await page.getByRole('button', { name: 'Change the password' }).click();
	await expect(page.getByText('Your password is changed.')).toBeVisible();

	// Still signed in here, under the new name.
	await page.setViewportSize({ width: 1440, height: 900 });
	await page.reload();
	await expect(page.getByRole('heading', { name: 'Your account' })).toBeVisible();
	await expect(page.getByTestId('header-account-link')).toHaveText('Rigging Electric', { useInnerText: true });
	await screenshot(page, 'account', 1440);

	// Signed out, the page sends you to sign in; the new password is the one that works.
	await page.getByTestId('header-account').getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/sign-in\?signedOut=1/);
	await page.goto('/account');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Faccount$/);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password').fill(FIRST_PASSWORD);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page.getByRole('alert')).toContainText('do not match');
	await page.getByLabel('Password').fill(NEW_PASSWORD);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page).toHaveURL(/\/account$/);
});
