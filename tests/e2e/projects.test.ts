import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, type DemoKey } from '../../scripts/seed/accounts';
import { DEMO_PROJECT_NAME } from '../../scripts/seed/project';
import { linkIn, waitForMail } from '../integration/auth/helpers/mail';
import { uniqueEmail } from '../integration/auth/helpers/factories';
import { gotoReady } from './helpers/session';

const demo = (key: DemoKey) => DEMO_ACCOUNTS.find((a) => a.key === key)!;
const shots = (name: string) => join(process.env.TEST_RESULTS_DIR ?? '.data/test-results', 'screens', name);

async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await gotoReady(page, '/sign-in');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page).toHaveURL(/\/projects/);
}

test.describe('on a phone (360 px)', () => {
	test.use({ viewport: { width: 360, height: 780 } });

	test('the demo gaffer signs in and sees the demo project, with their role', async ({ page }) => {
		await page.goto('/sign-in');
		await page.screenshot({ path: shots('sign-in-360.png'), fullPage: true });
		await signIn(page, demo('gaffer').email);
		const card = page.getByTestId('project-card').filter({ hasText: DEMO_PROJECT_NAME });
		await expect(card).toBeVisible();
		await expect(card).toContainText('Gaffer');
		await page.screenshot({ path: shots('projects-360.png'), fullPage: true });

		await card.click();
		await expect(page.getByTestId('project-name')).toHaveText(DEMO_PROJECT_NAME);
		await expect(page.getByTestId('your-role')).toHaveText('Gaffer');
		await expect(page.getByTestId('project-notes')).toContainText('Invented for the demo');
		const crew = page.getByTestId('member-list');
		for (const a of DEMO_ACCOUNTS) await expect(crew).toContainText(a.name);
		// A gaffer cannot archive or delete.
		await expect(page.getByRole('button', { name: /Archive the project|Delete the project/ })).toHaveCount(0);
		await page.screenshot({ path: shots('project-360.png'), fullPage: true });

		// Every button and link in the page body is at least a thumb high.
		const small = await page.locator('main a, main button, main input, main select').evaluateAll((els) =>
			els.filter((el) => (el as HTMLElement).offsetParent !== null && el.getBoundingClientRect().height < 44).map((el) => el.outerHTML.slice(0, 80))
		);
		expect(small).toEqual([]);
	});

	test('an error is shown plainly next to the field', async ({ page }) => {
		await page.goto('/sign-in');
		await page.getByRole('button', { name: 'Sign in', exact: true }).click();
		await expect(page.getByTestId('field-error').first()).toContainText('Enter your e-mail address.');
		await expect(page.getByLabel('E-mail', { exact: true })).toHaveAttribute('aria-invalid', 'true');
		await page.screenshot({ path: shots('sign-in-errors-360.png'), fullPage: true });
	});
});

test('the projects list shows only your projects, and a project you are not on does not exist for you', async ({ page }) => {
	await signIn(page, demo('dp').email);
	await page.getByRole('link', { name: 'New project' }).click();
	const name = `DP prep only ${Date.now()}`;
	await page.getByLabel('Name').fill(name);
	await page.getByRole('button', { name: 'Create the project' }).click();
	await expect(page.getByTestId('project-name')).toHaveText(name);
	await expect(page.getByTestId('your-role')).toHaveText('Owner');
	const url = page.url();

	await gotoReady(page, '/sign-out');
	await page.locator('#main').getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/sign-in\?signedOut=1/);
	await signIn(page, demo('gaffer').email);
	await expect(page.getByTestId('project-list')).toContainText(DEMO_PROJECT_NAME);
	await expect(page.getByTestId('project-list')).not.toContainText(name);
	const res = await page.goto(url);
	expect(res?.status()).toBe(404);
	await expect(page.getByTestId('error-page')).toContainText('Nothing here');
	const members = await page.goto(`${url}/members`);
	expect(members?.status()).toBe(404);
});

test('a viewer gets 403 when trying an owner action by hand', async ({ page, baseURL }) => {
	await signIn(page, demo('viewer').email);
	await page.getByTestId('project-card').filter({ hasText: DEMO_PROJECT_NAME }).click();
	await expect(page).toHaveURL(/\/projects\/\d+$/);
	const projectUrl = page.url();
	const res = await page.request.post(`${projectUrl}/members?/invite`, {
		form: { email: uniqueEmail('sneaky'), role: 'owner' },
		headers: { origin: baseURL!, accept: 'application/json' }
	});
	const body = await res.json();
	expect(body.type).toBe('error');
	expect(body.status ?? res.status()).toBe(403);
});

test('invitation end to end: the owner invites, the mail arrives, a new person joins with the role', async ({ page, browser }) => {
	await page.setViewportSize({ width: 1440, height: 900 });
	await signIn(page, demo('owner').email);
	await page.screenshot({ path: shots('projects-1440.png'), fullPage: true });
	await page.getByTestId('project-card').filter({ hasText: DEMO_PROJECT_NAME }).click();
	await page.getByRole('link', { name: 'Members and invitations' }).click();

	const email = uniqueEmail('e2e-invitee');
	const since = new Date();
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Role', { exact: true }).selectOption('colorist');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByTestId('form-alert')).toContainText(`Invitation sent to ${email}`);
	await expect(page.getByTestId('invitations')).toContainText(email);
	await page.screenshot({ path: shots('members-1440.png'), fullPage: true });

	const mail = await waitForMail(email, { subject: /invited you/, since });
	expect(mail.mail.subject).toContain(DEMO_PROJECT_NAME);
	const link = linkIn(mail, '/invite/');

	const invitee = await (await browser.newContext({ viewport: { width: 360, height: 780 } })).newPage();
	await invitee.goto(link);
	await expect(invitee.getByTestId('invitation-summary')).toContainText('colorist');
	await invitee.screenshot({ path: shots('invite-360.png'), fullPage: true });
	await invitee.getByRole('link', { name: 'Make an account and join' }).click();
	await expect(invitee.getByLabel('E-mail')).toHaveValue(email);
	await invitee.getByLabel('Your name').fill('Invited Colorist');
	await invitee.getByLabel('Password').fill('grading suite after dark');
	await invitee.getByRole('button', { name: 'Join the project' }).click();
	await expect(invitee.getByTestId('project-name')).toHaveText(DEMO_PROJECT_NAME);
	await expect(invitee.getByTestId('your-role')).toHaveText('Colorist');

	// Used once: the link now says so.
	await invitee.goto(link);
	await expect(invitee.getByRole('heading', { name: 'This invitation cannot be used' })).toBeVisible();

	await page.reload();
	await expect(page.getByTestId('members')).toContainText('Invited Colorist');
	await expect(page.getByTestId('invitations')).toHaveCount(0);
});
