import { expect, test } from '@playwright/test';
import knex from 'knex';
import { databaseConfig } from '../../src/lib/server/db/config';
import { notAnImage, photoWithGps } from '../unit/server/photos/images';
import { openDemoProject, screenshot, signIn } from './helpers/session';

/** The demo project needs a setup to attach photos to; add a test one if the seed has none yet. */
async function ensureSetup(projectPath: string): Promise<void> {
	const projectId = Number(projectPath.split('/').pop());
	const db = knex(databaseConfig());
	try {
		if (await db('setups').where({ project_id: projectId }).first('id')) return;
		const [dayId] = await db('shoot_days').insert({ project_id: projectId, shoot_date: '2026-12-02', label: 'Test night', location_name: 'Test location' });
		const [setupId] = await db('setups').insert({ project_id: projectId, shoot_day_id: dayId, name: 'Counter corner (test)' });
		await db('lights').insert({ project_id: projectId, setup_id: setupId, label: 'Test key', role: 'key', kind: 'led-rgbw' });
	} finally {
		await db.destroy();
	}
}

test('the demo gaffer adds a set photo on a phone: it goes straight to storage, the bar fills, the thumbnail appears', async ({ page, baseURL }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await ensureSetup(project);
	await page.goto(`${project}/photos`);
	await expect(page.getByRole('heading', { name: 'Set photos' })).toBeVisible();

	const caption = `Counter corner from the door ${Date.now().toString(36)}`;
	await page.getByTestId('photo-caption').fill(caption);
	const jpeg = await photoWithGps('jpeg', 1600, 1200);

	// The PUT leaves the app's origin for the storage's: a cross-origin request the bucket's CORS rule allows.
	const putDone = page.waitForResponse((r) => r.request().method() === 'PUT', { timeout: 15_000 });
	await page.getByTestId('photo-file').setInputFiles({ name: 'counter-corner.jpg', mimeType: 'image/jpeg', buffer: jpeg });
	const put = await putDone;
	expect(put.status()).toBe(200);
	const putUrl = new URL(put.url());
	expect(putUrl.origin).not.toBe(new URL(baseURL as string).origin);
	expect(putUrl.origin).toBe(process.env.S3_ENDPOINT);
	expect(putUrl.pathname).toMatch(/\/incoming\//);
	expect(await put.headerValue('access-control-allow-origin')).toBeTruthy();

	const progress = page.getByTestId('photo-upload-progress');
	await expect(progress).toHaveAttribute('data-phase', 'done', { timeout: 15_000 });
	await expect(progress).toHaveAttribute('aria-valuenow', '100');
	await expect(page.getByTestId('photo-upload-status')).toHaveText('counter-corner.jpg added.');
	await expect(page.getByTestId('photo-upload-error')).toHaveCount(0);

	// The new card shows its caption and a thumbnail that really loaded (through the 303 to storage).
	const card = page.getByTestId('photo-card').filter({ hasText: caption });
	await expect(card).toBeVisible();
	const thumb = card.getByTestId('photo-thumbnail');
	await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0)), { timeout: 10_000 }).toBe(480);
	await screenshot(page, 'photos', 360);

	// Tap to open the original: the cleaned full-size photo.
	await thumb.click();
	const viewer = page.getByTestId('photo-viewer');
	await expect(viewer).toBeVisible();
	await expect(viewer).toContainText('Location data was removed from this photo.');
	const original = viewer.getByTestId('photo-original');
	await expect.poll(() => original.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0)), { timeout: 10_000 }).toBe(1600);
	await screenshot(page, 'photo-viewer', 360);
	await page.getByRole('button', { name: 'Close' }).click();
	await expect(viewer).toBeHidden();
});

test('a file that is not a photo is refused with a sentence, and nothing is added', async ({ page }) => {
	await page.setViewportSize({ width: 360, height: 780 });
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await ensureSetup(project);
	await page.goto(`${project}/photos`);
	const before = await page.getByTestId('photo-count').textContent();

	await page.getByTestId('photo-file').setInputFiles({ name: 'plan.jpg', mimeType: 'image/jpeg', buffer: Buffer.from(notAnImage()) });
	await expect(page.getByTestId('photo-upload-error')).toContainText('That file is not a photo we can read', { timeout: 15_000 });
	await expect(page.getByTestId('photo-upload-error')).toContainText('Export it as JPEG');
	await expect(page.getByTestId('photo-count')).toHaveText(before ?? '');

	// Refused before anything is sent: a type that is not a photo.
	await page.getByTestId('photo-file').setInputFiles({ name: 'spin.gif', mimeType: 'image/gif', buffer: Buffer.from('GIF89a') });
	await expect(page.getByTestId('photo-upload-error')).toContainText('Photos can be JPEG, PNG or WebP');
	await screenshot(page, 'photo-refused', 360);
});

test('a viewer sees the photos but no uploader and no delete', async ({ page }) => {
	await signIn(page, 'viewer');
	const project = await openDemoProject(page);
	await ensureSetup(project);
	await page.goto(`${project}/photos`);
	await expect(page.getByRole('heading', { name: 'Set photos' })).toBeVisible();
	await expect(page.getByTestId('photo-uploader')).toHaveCount(0);
	// The gaffer's photo from the first test is there to look at, without a way to delete it.
	const card = page.getByTestId('photo-card').first();
	await expect(card).toBeVisible();
	await card.getByTestId('photo-thumbnail').click();
	await expect(page.getByTestId('photo-viewer')).toBeVisible();
	await expect(page.getByTestId('photo-delete')).toHaveCount(0);
});

test('the gaffer deletes a photo from the viewer, after confirming', async ({ page }) => {
	await signIn(page, 'gaffer');
	const project = await openDemoProject(page);
	await page.goto(`${project}/photos`);
	const count = Number((await page.getByTestId('photo-count').textContent())?.replace(/\D/g, ''));
	expect(count).toBeGreaterThan(0);
	const card = page.getByTestId('photo-card').first();
	const id = await card.getAttribute('data-photo-id');
	await card.getByTestId('photo-thumbnail').click();
	await page.getByTestId('photo-delete').click();
	await page.getByTestId('photo-delete-confirm').click();
	await expect(page.getByTestId('photo-viewer')).toBeHidden();
	await expect(page.locator(`[data-photo-id="${id}"]`)).toHaveCount(0);
	await expect(page.getByTestId('photo-count')).toHaveText(`(${count - 1})`);
});
