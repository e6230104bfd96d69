import { expect, test, type Page } from '@playwright/test';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../scripts/seed/accounts';
import { linkIn, waitForMail } from '../integration/auth/helpers/mail';
import { uniqueEmail } from '../integration/auth/helpers/factories';

const gaffer = DEMO_ACCOUNTS.find((a) => a.key === 'gaffer')!;

async function signIn(page: Page, email: string, password: string) {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
}

async function signOut(page: Page) {
	await page.getByTestId('account-bar').getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/sign-in\?signedOut=1/);
}

test('sign up, confirm from the captured mail, sign in, sign out', async ({ page }) => {
	const email = uniqueEmail('e2e-signup');
	const since = new Date();
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Night Electric');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('short');
	await page.getByRole('button', { name: 'Make my account' }).click();
	// Too short: the form says why, keeps the other fields, and sends nothing.
	await expect(page.getByTestId('field-error')).toContainText('at least 10 characters');
	await expect(page.getByLabel('Your name')).toHaveValue('Night Electric');

	await page.getByLabel('Password').fill('tube fluorescents stay on');
	await page.getByRole('button', { name: 'Make my account' }).click();
	await expect(page.getByRole('heading', { name: 'Confirm your address' })).toBeVisible();

	const mail = await waitForMail(email, { subject: /Confirm your address/, since });
	await page.goto(linkIn(mail, '/verify/'));
	await page.getByRole('button', { name: 'Confirm my address' }).click();
	await expect(page.getByTestId('form-alert')).toContainText('Your address is confirmed');
	await expect(page.getByLabel('E-mail', { exact: true })).toHaveValue(email);

	await page.getByLabel('Password').fill('tube fluorescents stay on');
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page).toHaveURL(/\/projects$/);
	await expect(page.getByTestId('account-bar')).toContainText('Night Electric');
	await expect(page.getByTestId('no-projects')).toBeVisible();

	await signOut(page);
	await page.goto('/projects');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fprojects/);
});

test('a wrong password and an unknown address get the same answer', async ({ page }) => {
	await signIn(page, gaffer.email, 'not the demo password');
	const alert = page.getByRole('alert');
	await expect(alert).toContainText('do not match');
	const first = await alert.textContent();
	await expect(page.getByLabel('E-mail', { exact: true })).toHaveValue(gaffer.email);

	await signIn(page, uniqueEmail('nobody'), 'not the demo password');
	await expect(page.getByRole('alert')).toHaveText(first!);
});

test('sign in with an e-mail link (it makes the account), through our landing page', async ({ page }) => {
	const email = uniqueEmail('e2e-link');
	const since = new Date();
	await page.goto('/sign-in?redirectTo=%2Fprojects');
	await page.getByLabel('E-mail for the link').fill(email);
	await page.getByRole('button', { name: 'Mail me a sign-in link' }).click();
	await expect(page).toHaveURL(/\/sign-in\/check-mail/);
	await expect(page.getByText('A sign-in link is on its way')).toBeVisible();

	const mail = await waitForMail(email, { subject: /sign-in link/, since });
	const link = linkIn(mail, '/sign-in/link');
	await page.goto(link);
	// Opening the link alone signs nobody in (a mail scanner fetching it uses nothing up).
	await expect(page.getByText(`Signing in as ${email}`)).toBeVisible();
	await page.getByRole('link', { name: 'Sign in to Chromaslate' }).click();
	await expect(page).toHaveURL(/\/projects$/);
	await expect(page.getByTestId('account-bar')).toContainText(email);

	// The link works once.
	await signOut(page);
	await page.goto(link);
	await page.getByRole('link', { name: 'Sign in to Chromaslate' }).click();
	await expect(page).toHaveURL(/\/sign-in\/problem\?error=Verification/);
	await expect(page.getByRole('alert')).toContainText('expired or has been used');
});

test('reset a forgotten password from the mail; the old session ends', async ({ page, browser }) => {
	// An account made by e-mail link has no password yet: the reset sets one.
	const email = uniqueEmail('e2e-reset');
	let since = new Date();
	await page.goto('/sign-in');
	await page.getByLabel('E-mail for the link').fill(email);
	await page.getByRole('button', { name: 'Mail me a sign-in link' }).click();
	await page.goto(linkIn(await waitForMail(email, { since }), '/sign-in/link'));
	await page.getByRole('link', { name: 'Sign in to Chromaslate' }).click();
	await expect(page).toHaveURL(/\/projects$/);

	const other = await browser.newContext();
	const resetPage = await other.newPage();
	since = new Date();
	await resetPage.goto('/reset');
	await resetPage.getByLabel('E-mail').fill(email);
	await resetPage.getByRole('button', { name: 'Mail me a reset link' }).click();
	await expect(resetPage.getByTestId('form-alert')).toContainText('a reset link is on its way');
	await resetPage.goto(linkIn(await waitForMail(email, { subject: /new Chromaslate password/, since }), '/reset/'));
	await resetPage.getByLabel('New password').fill('sodium streetlight orange');
	await resetPage.getByRole('button', { name: 'Set the new password' }).click();
	await expect(resetPage.getByTestId('form-alert')).toContainText('Your new password is set');
	await resetPage.getByLabel('Password').fill('sodium streetlight orange');
	await resetPage.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(resetPage).toHaveURL(/\/projects$/);
	await other.close();

	// The first browser's session was ended by the reset.
	await page.goto('/projects');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=/);
});

test('a reset request for an unknown address says the same as for a known one', async ({ page }) => {
	await page.goto('/reset');
	await page.getByLabel('E-mail').fill(uniqueEmail('ghost'));
	await page.getByRole('button', { name: 'Mail me a reset link' }).click();
	await expect(page.getByTestId('form-alert')).toContainText('has an account, a reset link is on its way');
});

test('too many wrong passwords for one address are refused for a while, with a clear message', async ({ page }) => {
	const email = uniqueEmail('e2e-limit');
	for (let i = 0; i < 5; i++) {
		await signIn(page, email, `wrong password ${i}`);
		await expect(page.getByRole('alert')).toContainText('do not match');
	}
	await signIn(page, email, 'wrong password 6');
	await expect(page.getByRole('alert')).toContainText(/Too many tries\. Wait about \d+ minutes/);
});

test('session cookie is httpOnly and SameSite=Lax; cross-site posts and direct Auth.js posts are refused', async ({ page, context, request, baseURL }) => {
	await signIn(page, gaffer.email, DEMO_PASSWORD);
	await expect(page).toHaveURL(/\/projects$/);
	const session = (await context.cookies()).find((c) => c.name.includes('authjs.session-token'));
	expect(session).toBeDefined();
	expect(session!.httpOnly).toBe(true);
	expect(session!.sameSite).toBe('Lax');
	// Plain http on 127.0.0.1 (tests): not Secure; any https origin or non-loopback production host is.
	expect(session!.secure).toBe(false);

	const form = { email: gaffer.email, password: DEMO_PASSWORD };
	const crossSite = await request.post('/sign-in?/password', { form, headers: { origin: 'http://elsewhere.example' }, maxRedirects: 0 });
	expect(crossSite.status()).toBe(403);
	const direct = await request.post('/auth/callback/credentials', { form, headers: { origin: baseURL! }, maxRedirects: 0 });
	expect(direct.status()).toBe(404);
	const directLink = await request.post('/auth/signin/nodemailer', { form: { email: gaffer.email }, headers: { origin: baseURL! }, maxRedirects: 0 });
	expect(directLink.status()).toBe(404);
});

test('captured mail can be read on /dev/mail when the local catcher runs', async ({ page }) => {
	const email = uniqueEmail('e2e-devmail');
	await page.goto('/sign-in');
	await page.getByLabel('E-mail for the link').fill(email);
	await page.getByRole('button', { name: 'Mail me a sign-in link' }).click();
	await waitForMail(email);
	await page.goto('/dev/mail');
	await page.getByTestId('captured-mail').getByRole('link', { name: new RegExp(email) }).first().click();
	await expect(page.getByTestId('mail-subject')).toHaveText('Your Chromaslate sign-in link');
	await expect(page.getByTestId('mail-link').first()).toContainText('/sign-in/link?');
});

test('what someone types before the page has finished loading (a slow phone on set) is kept when the app takes over', async ({ page }) => {
	// Hold back the app's scripts until the e-mail has been typed into the server-rendered form.
	let release!: () => void;
	const typed = new Promise<void>((r) => (release = r));
	await page.route('**/_app/immutable/**', async (route) => {
		await typed;
		await route.continue();
	});
	await page.goto('/sign-in', { waitUntil: 'commit' });
	const email = page.locator('form[action="?/password"] input[name="email"]');
	await email.fill(gaffer.email);
	await expect(page.locator('html[data-hydrated="true"]')).toHaveCount(0);
	release();
	await page.locator('html[data-hydrated="true"]').waitFor({ state: 'attached' });
	await expect(email).toHaveValue(gaffer.email);
	await page.locator('form[action="?/password"] input[name="password"]').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await expect(page).toHaveURL(/\/projects/);
});
